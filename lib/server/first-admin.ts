import "server-only";
// An empty install has no account at all. Its first administrator is invited by a command run on
// the server (npm run admin:create): the invitation goes through the normal mail path and the
// command prints the one-time link. Once an active administrator exists the command refuses;
// running it again before the link is used revokes the earlier link.
import { db } from "@/db/client";
import { activeAdministratorExists, insertSite, lockFirstAdminSetup, revokeOpenSetupInvitations, siteByCode } from "@/db/queries/accounts";
import { recordAudit } from "@/db/queries/audit-write";
import { AppError } from "@/lib/errors";
import { siteCodeFrom, type FirstAdminInput } from "@/lib/validation/first-admin";
import { issueInvitation } from "./accounts";

export async function inviteFirstAdministrator(input: FirstAdminInput, now = new Date()) {
  return db.transaction(async (tx) => {
    await lockFirstAdminSetup(tx);
    if (await activeAdministratorExists(tx)) {
      throw new AppError("conflict", "An administrator already exists. Further accounts are invited from the Staff page by an administrator.");
    }
    const code = input.siteCode ?? siteCodeFrom(input.site);
    const existing = await siteByCode(tx, code);
    const siteId = existing?.id ?? (await insertSite(tx, { code, name: input.site }));
    const revoked = await revokeOpenSetupInvitations(tx, now);
    const inv = await issueInvitation(tx, { email: input.email, siteId, siteName: existing?.name ?? input.site, role: "admin", invitedBy: null, now });
    await recordAudit({ siteId, action: "invitation.first_admin", entityType: "invitation", entityId: inv.id, ip: "server command", detail: { email: input.email, siteCode: code, revokedEarlier: revoked } }, tx);
    return { ...inv, siteId, siteCode: code, siteCreated: !existing, revokedEarlier: revoked };
  });
}
