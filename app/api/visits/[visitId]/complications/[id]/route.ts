import { deleteComplication } from "@/lib/server/complications";
import { scopeOf } from "@/lib/auth/guard";
import { idParam, route } from "@/lib/http/route";

export const DELETE = route<{ visitId: string; id: string }>({ roles: ["clinician"] }, async ({ user, params, ip }) => {
  await deleteComplication(scopeOf(user), idParam(params.visitId), idParam(params.id), ip);
  return { ok: true };
});
