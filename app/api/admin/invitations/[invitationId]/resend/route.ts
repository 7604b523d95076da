import { resendInvitation } from "@/lib/server/accounts";
import { idParam, route } from "@/lib/http/route";

export const POST = route<{ invitationId: string }>({ roles: ["admin"] }, async ({ user, params, ip }) =>
  resendInvitation({ id: idParam(params.invitationId), siteIds: user.siteIds, by: user.id, ip }),
);
