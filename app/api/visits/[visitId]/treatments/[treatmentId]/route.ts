import { deleteTreatment } from "@/lib/server/treatments";
import { scopeOf } from "@/lib/auth/guard";
import { idParam, route } from "@/lib/http/route";

export const DELETE = route<{ visitId: string; treatmentId: string }>({ roles: ["clinician"] }, async ({ user, params, ip }) => {
  const r = await deleteTreatment(scopeOf(user), idParam(params.visitId), idParam(params.treatmentId), ip);
  return { extent: r.extent };
});
