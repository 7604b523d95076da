import { deleteDose } from "@/lib/server/anaesthetic";
import { scopeOf } from "@/lib/auth/guard";
import { idParam, route } from "@/lib/http/route";

export const DELETE = route<{ visitId: string; doseId: string }>({ roles: ["clinician"] }, async ({ user, params, ip }) => {
  await deleteDose(scopeOf(user), idParam(params.visitId), idParam(params.doseId), ip);
  return { ok: true };
});
