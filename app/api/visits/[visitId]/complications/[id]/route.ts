import { deleteComplication } from "@/db/queries/complications";
import { recordAudit } from "@/db/queries/audit-write";
import { scopeOf } from "@/lib/auth/guard";
import { idParam, route } from "@/lib/http/route";

export const DELETE = route<{ visitId: string; id: string }>({ roles: ["clinician"] }, async ({ user, params, ip }) => {
  const id = idParam(params.id);
  const r = await deleteComplication(scopeOf(user), idParam(params.visitId), id);
  await recordAudit({ userId: user.id, siteId: r.visit.siteId, patientId: r.visit.patientId, action: "complication.delete", entityType: "complication", entityId: id, ip });
  return { ok: true };
});
