import { addTreatment, listTreatments } from "@/db/queries/treatments";
import { recordAudit } from "@/db/queries/audit-write";
import { scopeOf } from "@/lib/auth/guard";
import { idParam, json, readJson, route } from "@/lib/http/route";
import { treatmentSchema } from "@/lib/validation/treatments";

type P = { visitId: string };

export const GET = route<P>({ roles: ["clinician", "reviewer", "research_nurse", "admin"] }, async ({ user, params, ip }) => {
  const { visit, ...rest } = await listTreatments(scopeOf(user), idParam(params.visitId));
  await recordAudit({ userId: user.id, siteId: visit.siteId, patientId: visit.patientId, action: "visit.treatments.read", entityType: "visit", entityId: visit.id, ip });
  return rest;
});

/** The server computes the treated union itself; a reason is required from the caution level up. */
export const POST = route<P>({ roles: ["clinician"] }, async ({ req, user, params, ip }) => {
  const visitId = idParam(params.visitId);
  const input = await readJson(req, treatmentSchema);
  const r = await addTreatment(scopeOf(user), visitId, input);
  await recordAudit({
    userId: user.id, siteId: r.visit.siteId, patientId: r.visit.patientId, action: "treatment.create", entityType: "treatment", entityId: r.id, ip,
    detail: { modality: input.modality, arcs: input.arcs, visitTreatedFraction: r.extent.fraction, cautionFraction: r.cautionFraction, extentOverrideReason: r.overridden ? input.extentOverrideReason : undefined },
  });
  return json({ id: r.id, extent: r.extent, caution: r.extent.level === "caution" ? r.extent.message : null, overridden: r.overridden }, 201);
});
