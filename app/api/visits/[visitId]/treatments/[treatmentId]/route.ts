import { deleteTreatment } from "@/db/queries/treatments";
import { recordAudit } from "@/db/queries/audit-write";
import { scopeOf } from "@/lib/auth/guard";
import { idParam, route } from "@/lib/http/route";

export const DELETE = route<{ visitId: string; treatmentId: string }>({ roles: ["clinician"] }, async ({ user, params, ip }) => {
  const treatmentId = idParam(params.treatmentId);
  const r = await deleteTreatment(scopeOf(user), idParam(params.visitId), treatmentId);
  await recordAudit({ userId: user.id, siteId: r.visit.siteId, patientId: r.visit.patientId, action: "treatment.delete", entityType: "treatment", entityId: treatmentId, ip });
  return { extent: r.extent };
});
