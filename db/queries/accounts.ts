import "server-only";
// Invitations, password resets and account changes. Mail is queued in the same transaction as
// the change, so a rolled-back change sends nothing.
import { randomUUID } from "node:crypto";
import { and, desc, eq, gt, inArray, isNull } from "drizzle-orm";
import { db } from "../client";
import { auditEvents, invitations, passwordResets, sites, users, userSites } from "../schema";
import { hashPassword } from "@/lib/auth/password";
import { AppError } from "@/lib/errors";
import { expiryFrom, hashToken, INVITATION_TTL_MS, issueToken, RESET_TTL_MS } from "@/lib/accounts/tokens";
import { passwordProblem } from "@/lib/accounts/password-rules";
import { mailConfigFrom } from "@/lib/mail/config";
import { enqueueMail } from "@/lib/mail/outbox";
import { invitationMail, resetMail } from "@/lib/mail/templates";
import type { Role } from "@/lib/domain/vocab";

const LINK_GONE = "This link has expired or was already used. Ask for a new one.";

function audit(tx: Pick<typeof db, "insert">, e: typeof auditEvents.$inferInsert) {
  return tx.insert(auditEvents).values(e);
}

export async function inviteUser(a: { email: string; siteId: string; role: Role; invitedBy: string; ip: string; now?: Date }) {
  return db.transaction(async (tx) => {
    const [existing] = await tx.select({ id: users.id }).from(users).where(eq(users.email, a.email)).limit(1);
    if (existing) throw new AppError("conflict", "An account with this address already exists.", { email: ["An account with this address already exists."] });
    const [site] = await tx.select({ name: sites.name }).from(sites).where(eq(sites.id, a.siteId)).limit(1);
    if (!site) throw new AppError("not_found");
    const { token, tokenHash } = issueToken();
    const expiresAt = expiryFrom(a.now ?? new Date(), INVITATION_TTL_MS);
    const [inv] = await tx
      .insert(invitations)
      .values({ email: a.email, siteId: a.siteId, role: a.role, tokenHash, expiresAt, invitedBy: a.invitedBy })
      .returning({ id: invitations.id });
    await queueInvitationMail(tx, { id: inv!.id, email: a.email, role: a.role, siteName: site.name, invitedBy: a.invitedBy, token, tokenHash, expiresAt });
    await audit(tx, { userId: a.invitedBy, siteId: a.siteId, action: "invitation.created", entityType: "invitation", entityId: inv!.id, ip: a.ip, detail: { email: a.email, role: a.role } });
    return { id: inv!.id, expiresAt };
  });
}

type Runner = Parameters<Parameters<typeof db.transaction>[0]>[0];

async function queueInvitationMail(tx: Runner, i: { id: string; email: string; role: Role; siteName: string; invitedBy: string; token: string; tokenHash: string; expiresAt: Date }) {
  const [by] = await tx.select({ name: users.displayName }).from(users).where(eq(users.id, i.invitedBy)).limit(1);
  const link = `${mailConfigFrom(process.env).appBaseUrl}/accept-invite/${i.token}`;
  const mail = invitationMail({ link, siteName: i.siteName, role: i.role, invitedByName: by?.name ?? "An administrator", expiresAt: i.expiresAt });
  // One mail per token: a re-send issues a new token and so a new key.
  await enqueueMail(tx, { idempotencyKey: `invitation:${i.id}:${i.tokenHash.slice(0, 16)}`, to: i.email, ...mail });
}

/** Open and recent invitations at the given sites, newest first. */
export async function listInvitations(siteIds: string[]) {
  if (siteIds.length === 0) return [];
  return db
    .select({ id: invitations.id, email: invitations.email, role: invitations.role, siteId: invitations.siteId, siteName: sites.name, expiresAt: invitations.expiresAt, usedAt: invitations.usedAt, revokedAt: invitations.revokedAt, createdAt: invitations.createdAt })
    .from(invitations)
    .innerJoin(sites, eq(sites.id, invitations.siteId))
    .where(inArray(invitations.siteId, siteIds))
    .orderBy(desc(invitations.createdAt))
    .limit(50);
}

async function openInvitationForAdmin(tx: Runner, id: string, siteIds: string[]) {
  const [inv] = await tx.select().from(invitations).where(and(eq(invitations.id, id), siteIds.length ? inArray(invitations.siteId, siteIds) : undefined)).for("update").limit(1);
  if (!inv || siteIds.length === 0) throw new AppError("not_found");
  if (inv.usedAt || inv.revokedAt) throw new AppError("conflict", "This invitation was already accepted or revoked.");
  return inv;
}

export async function revokeInvitation(a: { id: string; siteIds: string[]; by: string; ip: string }) {
  await db.transaction(async (tx) => {
    const inv = await openInvitationForAdmin(tx, a.id, a.siteIds);
    await tx.update(invitations).set({ revokedAt: new Date() }).where(eq(invitations.id, inv.id));
    await audit(tx, { userId: a.by, siteId: inv.siteId, action: "invitation.revoked", entityType: "invitation", entityId: inv.id, ip: a.ip, detail: { email: inv.email } });
  });
}

/** A new token and a fresh 72 hours; the old link stops working. */
export async function resendInvitation(a: { id: string; siteIds: string[]; by: string; ip: string; now?: Date }) {
  return db.transaction(async (tx) => {
    const inv = await openInvitationForAdmin(tx, a.id, a.siteIds);
    const [site] = await tx.select({ name: sites.name }).from(sites).where(eq(sites.id, inv.siteId)).limit(1);
    const { token, tokenHash } = issueToken();
    const expiresAt = expiryFrom(a.now ?? new Date(), INVITATION_TTL_MS);
    await tx.update(invitations).set({ tokenHash, expiresAt }).where(eq(invitations.id, inv.id));
    await queueInvitationMail(tx, { id: inv.id, email: inv.email, role: inv.role, siteName: site!.name, invitedBy: a.by, token, tokenHash, expiresAt });
    await audit(tx, { userId: a.by, siteId: inv.siteId, action: "invitation.resent", entityType: "invitation", entityId: inv.id, ip: a.ip, detail: { email: inv.email } });
    return { id: inv.id, expiresAt };
  });
}

/** What the accept page shows before the form; null when the link is not usable. */
export async function peekInvitation(token: string, now = new Date()) {
  const [inv] = await db
    .select({ email: invitations.email, role: invitations.role, siteName: sites.name })
    .from(invitations)
    .innerJoin(sites, eq(sites.id, invitations.siteId))
    .where(and(eq(invitations.tokenHash, hashToken(token)), isNull(invitations.usedAt), isNull(invitations.revokedAt), gt(invitations.expiresAt, now)))
    .limit(1);
  return inv ?? null;
}

export async function acceptInvitation(a: { token: string; displayName: string; password: string; ip: string; now?: Date }) {
  const now = a.now ?? new Date();
  return db.transaction(async (tx) => {
    const [inv] = await tx.select().from(invitations).where(eq(invitations.tokenHash, hashToken(a.token))).for("update").limit(1);
    if (!inv || inv.usedAt || inv.revokedAt || inv.expiresAt <= now) throw new AppError("invalid", LINK_GONE, { token: [LINK_GONE] });
    const problem = passwordProblem(a.password, { email: inv.email, displayName: a.displayName });
    if (problem) throw new AppError("invalid", undefined, { password: [problem] });
    const [taken] = await tx.select({ id: users.id }).from(users).where(eq(users.email, inv.email)).limit(1);
    if (taken) throw new AppError("conflict", "An account with this address already exists. Sign in or reset the password.");
    const userId = `u-${randomUUID()}`;
    await tx.insert(users).values({ id: userId, email: inv.email, displayName: a.displayName, role: inv.role, passwordHash: await hashPassword(a.password) });
    await tx.insert(userSites).values({ userId, siteId: inv.siteId });
    await tx.update(invitations).set({ usedAt: now }).where(eq(invitations.id, inv.id));
    await audit(tx, { userId, siteId: inv.siteId, action: "invitation.accepted", entityType: "invitation", entityId: inv.id, ip: a.ip, detail: { email: inv.email, role: inv.role } });
    return { userId, email: inv.email };
  });
}

/** Queues a reset mail when the address belongs to an active account; says nothing either way. */
export async function requestPasswordReset(a: { email: string; ip: string; now?: Date }): Promise<void> {
  await db.transaction(async (tx) => {
    const [user] = await tx.select({ id: users.id, active: users.active }).from(users).where(eq(users.email, a.email)).limit(1);
    if (!user || !user.active) {
      await audit(tx, { action: "password_reset.requested", ip: a.ip, detail: { email: a.email, known: false } });
      return;
    }
    const { token, tokenHash } = issueToken();
    const expiresAt = expiryFrom(a.now ?? new Date(), RESET_TTL_MS);
    const [reset] = await tx.insert(passwordResets).values({ userId: user.id, tokenHash, expiresAt }).returning({ id: passwordResets.id });
    const link = `${mailConfigFrom(process.env).appBaseUrl}/reset-password/${token}`;
    await enqueueMail(tx, { idempotencyKey: `password-reset:${reset!.id}`, to: a.email, ...resetMail({ link }) });
    await audit(tx, { userId: user.id, action: "password_reset.requested", entityType: "password_reset", entityId: reset!.id, ip: a.ip, detail: { email: a.email, known: true } });
  });
}

/** Sets the new password once; the caller ends the user's other sessions. */
export async function completePasswordReset(a: { token: string; password: string; ip: string; now?: Date }) {
  const now = a.now ?? new Date();
  return db.transaction(async (tx) => {
    const [reset] = await tx.select().from(passwordResets).where(eq(passwordResets.tokenHash, hashToken(a.token))).for("update").limit(1);
    const [user] = reset ? await tx.select({ id: users.id, email: users.email, displayName: users.displayName, active: users.active }).from(users).where(eq(users.id, reset.userId)).limit(1) : [];
    if (!reset || reset.usedAt || reset.expiresAt <= now || !user?.active) throw new AppError("invalid", LINK_GONE, { token: [LINK_GONE] });
    const problem = passwordProblem(a.password, { email: user.email, displayName: user.displayName });
    if (problem) throw new AppError("invalid", undefined, { password: [problem] });
    await tx.update(users).set({ passwordHash: await hashPassword(a.password) }).where(eq(users.id, user.id));
    // Every other reset link of this user dies with this one.
    await tx.update(passwordResets).set({ usedAt: now }).where(and(eq(passwordResets.userId, user.id), isNull(passwordResets.usedAt)));
    await audit(tx, { userId: user.id, action: "password_reset.completed", entityType: "password_reset", entityId: reset.id, ip: a.ip });
    return { userId: user.id };
  });
}

/** Role or active flag of a user who shares a site with the admin; an admin cannot lock themself out. */
export async function updateUser(a: { userId: string; adminId: string; adminSiteIds: string[]; role?: Role; active?: boolean; ip: string }) {
  if (a.userId === a.adminId) throw new AppError("invalid", "You cannot change your own role or deactivate yourself.", { _: ["Ask another administrator."] });
  return db.transaction(async (tx) => {
    const [user] = a.adminSiteIds.length
      ? await tx.selectDistinct({ id: users.id, role: users.role, active: users.active }).from(users).innerJoin(userSites, eq(userSites.userId, users.id)).where(and(eq(users.id, a.userId), inArray(userSites.siteId, a.adminSiteIds)))
      : [];
    if (!user) throw new AppError("not_found");
    const after = { role: a.role ?? user.role, active: a.active ?? user.active };
    await tx.update(users).set(after).where(eq(users.id, user.id));
    const action = a.active === false && user.active ? "user.deactivated" : a.active === true && !user.active ? "user.reactivated" : "user.updated";
    await audit(tx, { userId: a.adminId, action, entityType: "user", entityId: user.id, ip: a.ip, detail: { before: { role: user.role, active: user.active }, after } });
    return { id: user.id, ...after, wasActive: user.active };
  });
}
