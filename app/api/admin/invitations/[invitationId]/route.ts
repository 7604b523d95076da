import { revokeInvitation } from "@/lib/server/accounts";
import { idParam, route } from "@/lib/http/route";

export const DELETE = route<{ invitationId: string }>({ roles: ["admin"] }, async ({ user, params, ip }) => {
  await revokeInvitation({ id: idParam(params.invitationId), siteIds: user.siteIds, by: user.id, ip });
  return { ok: true };
});
