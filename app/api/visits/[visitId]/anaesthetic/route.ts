import { addDose, listDoses } from "@/db/queries/anaesthetic";
import { recordAudit } from "@/db/queries/audit-write";
import { scopeOf } from "@/lib/auth/guard";
import { idParam, json, readJson, route } from "@/lib/http/route";
import { anaestheticSchema } from "@/lib/validation/treatments";

type P = { visitId: string };

export const GET = route<P>({ roles: ["clinician", "reviewer", "research_nurse", "admin"] }, async ({ user, params, ip }) => {
  const { visit, ...rest } = await listDoses(scopeOf(user), idParam(params.visitId));
  await recordAudit({ userId: user.id, siteId: visit.siteId, patientId: visit.patientId, action: "visit.anaesthetic.read", entityType: "visit", entityId: visit.id, ip });
  return rest;
});

/** mg and the running totals are computed here from % and mL; any client figure is stripped by the schema. */
export const POST = route<P>({ roles: ["clinician"] }, async ({ req, user, params, ip }) => {
  const visitId = idParam(params.visitId);
  const input = await readJson(req, anaestheticSchema);
  const r = await addDose(scopeOf(user), user.id, visitId, input);
  await recordAudit({
    userId: user.id, siteId: r.visit.siteId, patientId: r.visit.patientId, action: r.gate.over ? "anaesthetic.create.override" : "anaesthetic.create", entityType: "anaesthetic_dose", entityId: r.id, ip,
    detail: { agent: input.agent, doseMg: r.doseMg, over: r.gate.over, near: r.gate.near, message: r.gate.message, overrideReason: r.gate.over ? input.overrideReason : undefined },
  });
  return json({ id: r.id, doseMg: r.doseMg, assessment: r.gate.after, over: r.gate.over, near: r.gate.near, message: r.gate.message }, 201);
});
