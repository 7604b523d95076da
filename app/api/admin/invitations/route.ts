import { listInvitations } from "@/db/queries/accounts";
import { inviteUser } from "@/lib/server/accounts";
import { inviteSchema } from "@/lib/accounts/schemas";
import { requireSite } from "@/lib/auth/guard";
import { readJson, route } from "@/lib/http/route";

export const GET = route({ roles: ["admin"] }, async ({ user }) => ({ invitations: await listInvitations(user.siteIds) }));

export const POST = route({ roles: ["admin"] }, async ({ req, user, ip }) => {
  const body = await readJson(req, inviteSchema);
  requireSite(user, body.siteId);
  return inviteUser({ ...body, invitedBy: user.id, ip });
});
