import { addComplication, listComplications } from "@/db/queries/complications";
import { recordAudit } from "@/db/queries/audit-write";
import { scopeOf } from "@/lib/auth/guard";
import { idParam, json, readJson, route } from "@/lib/http/route";
import { complicationSchema } from "@/lib/validation/visit-record";

type P = { visitId: string };

export const GET = route<P>({ roles: ["clinician", "reviewer", "research_nurse", "admin"] }, async ({ user, params, ip }) => {
  const { visit, complications } = await listComplications(scopeOf(user), idParam(params.visitId));
  await recordAudit({ userId: user.id, siteId: visit.siteId, patientId: visit.patientId, action: "visit.complications.read", entityType: "visit", entityId: visit.id, ip });
  return { complications };
});

export const POST = route<P>({ roles: ["clinician"] }, async ({ req, user, params, ip }) => {
  const visitId = idParam(params.visitId);
  const input = await readJson(req, complicationSchema);
  const r = await addComplication(scopeOf(user), visitId, input);
  await recordAudit({ userId: user.id, siteId: r.visit.siteId, patientId: r.visit.patientId, action: "complication.create", entityType: "complication", entityId: r.id, ip, detail: { kind: input.kind, severity: input.severity, timing: input.timing } });
  return json({ id: r.id }, 201);
});
