import { deleteDose } from "@/db/queries/anaesthetic";
import { recordAudit } from "@/db/queries/audit-write";
import { scopeOf } from "@/lib/auth/guard";
import { idParam, route } from "@/lib/http/route";

export const DELETE = route<{ visitId: string; doseId: string }>({ roles: ["clinician"] }, async ({ user, params, ip }) => {
  const doseId = idParam(params.doseId);
  const r = await deleteDose(scopeOf(user), idParam(params.visitId), doseId);
  await recordAudit({ userId: user.id, siteId: r.visit.siteId, patientId: r.visit.patientId, action: "anaesthetic.delete", entityType: "anaesthetic_dose", entityId: doseId, ip });
  return { ok: true };
});
