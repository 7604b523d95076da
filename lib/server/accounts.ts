import "server-only";
// Invitations, password resets and account changes. Mail is queued in the same transaction as
// the change, so a rolled-back change sends nothing.
import { randomUUID } from "node:crypto";
import { db, type Tx } from "@/db/client";
import {
  displayNameOf, insertInvitation, insertPasswordReset, insertUserAtSite, invitationAtSitesForUpdate, invitationByTokenHashForUpdate, resetByTokenHashForUpdate,
  setPasswordHash, setUserRoleAndActive, siteName, siteNames, sitesWithAnotherActiveAdmin, userForAccountChange, lockSiteAdministration, updateInvitation, usableInvitationByTokenHash, useUpResets, userForReset, userIdByEmail, userIdentity,
} from "@/db/queries/accounts";
import { recordAudit } from "@/db/queries/audit-write";
import { hashPassword } from "@/lib/auth/password";
import { AppError } from "@/lib/errors";
import { expiryFrom, hashToken, INVITATION_TTL_MS, issueToken, RESET_TTL_MS } from "@/lib/accounts/tokens";
import { passwordProblem } from "@/lib/accounts/password-rules";
import { accountChangeRefusal } from "@/lib/accounts/admin-rights";
import { mailConfigFrom } from "@/lib/mail/config";
import { invitationMail, resetMail } from "@/lib/mail/templates";
import type { Role } from "@/lib/domain/vocab";
import { enqueueMail } from "./outbox";

const LINK_GONE = "This link has expired or was already used. Ask for a new one.";

export async function inviteUser(a: { email: string; siteId: string; role: Role; invitedBy: string; ip: string; now?: Date }) {
  return db.transaction(async (tx) => {
    if (await userIdByEmail(tx, a.email)) throw new AppError("conflict", "An account with this address already exists.", { email: ["An account with this address already exists."] });
    const name = await siteName(tx, a.siteId);
    if (!name) throw new AppError("not_found");
    const { id, expiresAt } = await issueInvitation(tx, { email: a.email, siteId: a.siteId, siteName: name, role: a.role, invitedBy: a.invitedBy, now: a.now });
    await recordAudit({ userId: a.invitedBy, siteId: a.siteId, action: "invitation.created", entityType: "invitation", entityId: id, ip: a.ip, detail: { email: a.email, role: a.role } }, tx);
    return { id, expiresAt };
  });
}

/**
 * A new invitation and its mail, queued in the caller's transaction. The one-time link is
 * returned as well, for the first administrator's command to print (nobody else sees it).
 */
export async function issueInvitation(tx: Tx, a: { email: string; siteId: string; siteName: string; role: Role; invitedBy: string | null; now?: Date }) {
  const { token, tokenHash } = issueToken();
  const expiresAt = expiryFrom(a.now ?? new Date(), INVITATION_TTL_MS);
  const id = await insertInvitation(tx, { email: a.email, siteId: a.siteId, role: a.role, tokenHash, expiresAt, invitedBy: a.invitedBy });
  const link = await queueInvitationMail(tx, { id, email: a.email, role: a.role, siteName: a.siteName, invitedBy: a.invitedBy, token, tokenHash, expiresAt });
  return { id, expiresAt, link };
}

async function queueInvitationMail(tx: Tx, i: { id: string; email: string; role: Role; siteName: string; invitedBy: string | null; token: string; tokenHash: string; expiresAt: Date }): Promise<string> {
  const link = `${mailConfigFrom(process.env).appBaseUrl}/accept-invite/${i.token}`;
  const invitedByName = (i.invitedBy ? await displayNameOf(tx, i.invitedBy) : null) ?? "An administrator";
  const mail = invitationMail({ link, siteName: i.siteName, role: i.role, invitedByName, expiresAt: i.expiresAt });
  // One mail per token: a re-send issues a new token and so a new key.
  await enqueueMail(tx, { idempotencyKey: `invitation:${i.id}:${i.tokenHash.slice(0, 16)}`, to: i.email, ...mail });
  return link;
}

async function openInvitationForAdmin(tx: Tx, id: string, siteIds: string[]) {
  const inv = await invitationAtSitesForUpdate(tx, id, siteIds);
  if (!inv) throw new AppError("not_found");
  if (inv.usedAt || inv.revokedAt) throw new AppError("conflict", "This invitation was already accepted or revoked.");
  return inv;
}

export async function revokeInvitation(a: { id: string; siteIds: string[]; by: string; ip: string }) {
  await db.transaction(async (tx) => {
    const inv = await openInvitationForAdmin(tx, a.id, a.siteIds);
    await updateInvitation(tx, inv.id, { revokedAt: new Date() });
    await recordAudit({ userId: a.by, siteId: inv.siteId, action: "invitation.revoked", entityType: "invitation", entityId: inv.id, ip: a.ip, detail: { email: inv.email } }, tx);
  });
}

/** A new token and a fresh 72 hours; the old link stops working. */
export async function resendInvitation(a: { id: string; siteIds: string[]; by: string; ip: string; now?: Date }) {
  return db.transaction(async (tx) => {
    const inv = await openInvitationForAdmin(tx, a.id, a.siteIds);
    const name = await siteName(tx, inv.siteId);
    const { token, tokenHash } = issueToken();
    const expiresAt = expiryFrom(a.now ?? new Date(), INVITATION_TTL_MS);
    await updateInvitation(tx, inv.id, { tokenHash, expiresAt });
    await queueInvitationMail(tx, { id: inv.id, email: inv.email, role: inv.role, siteName: name!, invitedBy: a.by, token, tokenHash, expiresAt });
    await recordAudit({ userId: a.by, siteId: inv.siteId, action: "invitation.resent", entityType: "invitation", entityId: inv.id, ip: a.ip, detail: { email: inv.email } }, tx);
    return { id: inv.id, expiresAt };
  });
}

/** What the accept page shows before the form; null when the link is not usable. */
export function peekInvitation(token: string, now = new Date()) {
  return usableInvitationByTokenHash(hashToken(token), now);
}

export async function acceptInvitation(a: { token: string; displayName: string; password: string; ip: string; now?: Date }) {
  const now = a.now ?? new Date();
  return db.transaction(async (tx) => {
    const inv = await invitationByTokenHashForUpdate(tx, hashToken(a.token));
    if (!inv || inv.usedAt || inv.revokedAt || inv.expiresAt <= now) throw new AppError("invalid", LINK_GONE, { token: [LINK_GONE] });
    const problem = passwordProblem(a.password, { email: inv.email, displayName: a.displayName });
    if (problem) throw new AppError("invalid", undefined, { password: [problem] });
    if (await userIdByEmail(tx, inv.email)) throw new AppError("conflict", "An account with this address already exists. Sign in or reset the password.");
    const userId = `u-${randomUUID()}`;
    await insertUserAtSite(tx, { id: userId, email: inv.email, displayName: a.displayName, role: inv.role, passwordHash: await hashPassword(a.password) }, inv.siteId);
    await updateInvitation(tx, inv.id, { usedAt: now });
    await recordAudit({ userId, siteId: inv.siteId, action: "invitation.accepted", entityType: "invitation", entityId: inv.id, ip: a.ip, detail: { email: inv.email, role: inv.role } }, tx);
    return { userId, email: inv.email };
  });
}

/** Queues a reset mail when the address belongs to an active account; says nothing either way. */
export async function requestPasswordReset(a: { email: string; ip: string; now?: Date }): Promise<void> {
  await db.transaction(async (tx) => {
    const user = await userForReset(tx, a.email);
    if (!user || !user.active) {
      await recordAudit({ action: "password_reset.requested", ip: a.ip, detail: { email: a.email, known: false } }, tx);
      return;
    }
    const { token, tokenHash } = issueToken();
    const expiresAt = expiryFrom(a.now ?? new Date(), RESET_TTL_MS);
    const resetId = await insertPasswordReset(tx, { userId: user.id, tokenHash, expiresAt });
    const link = `${mailConfigFrom(process.env).appBaseUrl}/reset-password/${token}`;
    await enqueueMail(tx, { idempotencyKey: `password-reset:${resetId}`, to: a.email, ...resetMail({ link }) });
    await recordAudit({ userId: user.id, action: "password_reset.requested", entityType: "password_reset", entityId: resetId, ip: a.ip, detail: { email: a.email, known: true } }, tx);
  });
}

/** Sets the new password once; the caller ends the user's other sessions. */
export async function completePasswordReset(a: { token: string; password: string; ip: string; now?: Date }) {
  const now = a.now ?? new Date();
  return db.transaction(async (tx) => {
    const reset = await resetByTokenHashForUpdate(tx, hashToken(a.token));
    const user = reset ? await userIdentity(tx, reset.userId) : null;
    if (!reset || reset.usedAt || reset.expiresAt <= now || !user?.active) throw new AppError("invalid", LINK_GONE, { token: [LINK_GONE] });
    const problem = passwordProblem(a.password, { email: user.email, displayName: user.displayName });
    if (problem) throw new AppError("invalid", undefined, { password: [problem] });
    await setPasswordHash(tx, user.id, await hashPassword(a.password));
    // Every other reset link of this user dies with this one.
    await useUpResets(tx, user.id, now);
    await recordAudit({ userId: user.id, action: "password_reset.completed", entityType: "password_reset", entityId: reset.id, ip: a.ip }, tx);
    return { userId: user.id };
  });
}

/**
 * Role or active flag of a user who shares a site with the admin. A role applies at every site
 * the user works at, so the admin must administer all of them (403 otherwise), and no site of the
 * user may be left without an active administrator (409). An admin may step down themself only
 * while another active administrator remains at each of their sites.
 */
export async function updateUser(a: { userId: string; adminId: string; adminSiteIds: string[]; role?: Role; active?: boolean; ip: string }) {
  return db.transaction(async (tx) => {
    const user = await userForAccountChange(tx, a.userId);
    if (!user || !user.siteIds.some((s) => a.adminSiteIds.includes(s))) throw new AppError("not_found");
    await lockSiteAdministration(tx, user.siteIds);
    const after = { role: a.role ?? user.role, active: a.active ?? user.active };
    const refusal = accountChangeRefusal({
      adminSiteIds: a.adminSiteIds, target: user, after,
      sitesWithAnotherAdmin: await sitesWithAnotherActiveAdmin(tx, user.siteIds, user.id),
    });
    if (refusal) {
      const names = (await siteNames(tx, refusal.siteIds)).join(", ");
      throw refusal.code === "forbidden"
        ? new AppError("forbidden", `This person also works at ${names}, where you are not an administrator. A role or an active flag applies at every site, so an administrator of all of their sites must make this change.`)
        : new AppError("conflict", `This would leave ${names} without an active administrator. Make someone else an administrator there first.`);
    }
    await setUserRoleAndActive(tx, user.id, after);
    const action = a.active === false && user.active ? "user.deactivated" : a.active === true && !user.active ? "user.reactivated" : "user.updated";
    await recordAudit({ userId: a.adminId, action, entityType: "user", entityId: user.id, ip: a.ip, detail: { before: { role: user.role, active: user.active }, after } }, tx);
    return { id: user.id, ...after, wasActive: user.active };
  });
}
