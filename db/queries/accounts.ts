import "server-only";
// Statements of invitations, password resets and account changes (lib/server/accounts.ts decides).
import { and, desc, eq, gt, inArray, isNull, sql as dsql } from "drizzle-orm";
import { db, type Tx } from "../client";
import { invitations, passwordResets, sites, users, userSites } from "../schema";
import type { Role } from "@/lib/domain/vocab";

export async function userIdByEmail(tx: Tx, email: string) {
  const [u] = await tx.select({ id: users.id }).from(users).where(eq(users.email, email)).limit(1);
  return u ?? null;
}

export async function siteName(tx: Tx, siteId: string): Promise<string | null> {
  const [site] = await tx.select({ name: sites.name }).from(sites).where(eq(sites.id, siteId)).limit(1);
  return site?.name ?? null;
}

export async function displayNameOf(tx: Tx, userId: string): Promise<string | null> {
  const [by] = await tx.select({ name: users.displayName }).from(users).where(eq(users.id, userId)).limit(1);
  return by?.name ?? null;
}

export async function insertInvitation(tx: Tx, values: typeof invitations.$inferInsert): Promise<string> {
  const [inv] = await tx.insert(invitations).values(values).returning({ id: invitations.id });
  return inv!.id;
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

/** An invitation of one of the sites, locked. */
export async function invitationAtSitesForUpdate(tx: Tx, id: string, siteIds: string[]) {
  if (siteIds.length === 0) return null;
  const [inv] = await tx.select().from(invitations).where(and(eq(invitations.id, id), inArray(invitations.siteId, siteIds))).for("update").limit(1);
  return inv ?? null;
}

export async function updateInvitation(tx: Tx, id: string, set: Partial<typeof invitations.$inferInsert>): Promise<void> {
  await tx.update(invitations).set(set).where(eq(invitations.id, id));
}

/** What the accept page shows before the form; null when the link is not usable. */
export async function usableInvitationByTokenHash(tokenHash: string, now: Date) {
  const [inv] = await db
    .select({ email: invitations.email, role: invitations.role, siteName: sites.name })
    .from(invitations)
    .innerJoin(sites, eq(sites.id, invitations.siteId))
    .where(and(eq(invitations.tokenHash, tokenHash), isNull(invitations.usedAt), isNull(invitations.revokedAt), gt(invitations.expiresAt, now)))
    .limit(1);
  return inv ?? null;
}

export async function invitationByTokenHashForUpdate(tx: Tx, tokenHash: string) {
  const [inv] = await tx.select().from(invitations).where(eq(invitations.tokenHash, tokenHash)).for("update").limit(1);
  return inv ?? null;
}

export async function insertUserAtSite(tx: Tx, user: { id: string; email: string; displayName: string; role: Role; passwordHash: string }, siteId: string): Promise<void> {
  await tx.insert(users).values(user);
  await tx.insert(userSites).values({ userId: user.id, siteId });
}

export async function userForReset(tx: Tx, email: string) {
  const [user] = await tx.select({ id: users.id, active: users.active }).from(users).where(eq(users.email, email)).limit(1);
  return user ?? null;
}

export async function insertPasswordReset(tx: Tx, values: typeof passwordResets.$inferInsert): Promise<string> {
  const [reset] = await tx.insert(passwordResets).values(values).returning({ id: passwordResets.id });
  return reset!.id;
}

export async function resetByTokenHashForUpdate(tx: Tx, tokenHash: string) {
  const [reset] = await tx.select().from(passwordResets).where(eq(passwordResets.tokenHash, tokenHash)).for("update").limit(1);
  return reset ?? null;
}

export async function userIdentity(tx: Tx, userId: string) {
  const [user] = await tx.select({ id: users.id, email: users.email, displayName: users.displayName, active: users.active }).from(users).where(eq(users.id, userId)).limit(1);
  return user ?? null;
}

export async function setPasswordHash(tx: Tx, userId: string, passwordHash: string): Promise<void> {
  await tx.update(users).set({ passwordHash }).where(eq(users.id, userId));
}

/** Every open reset link of the user is used up. */
export async function useUpResets(tx: Tx, userId: string, now: Date): Promise<void> {
  await tx.update(passwordResets).set({ usedAt: now }).where(and(eq(passwordResets.userId, userId), isNull(passwordResets.usedAt)));
}

/** A user who works at one of the sites. */
/** The user, locked for the change, with every site they work at (not only the caller's). */
export async function userForAccountChange(tx: Tx, userId: string) {
  const [user] = await tx
    .select({
      id: users.id, role: users.role, active: users.active,
      siteIds: dsql<string[]>`array(select us.site_id::text from user_sites us where us.user_id = ${users.id} order by 1)`,
    })
    .from(users)
    .where(eq(users.id, userId))
    .for("update");
  return user ?? null;
}

/** Serialises changes of administrators per site (sorted, so two changes cannot deadlock). */
export async function lockSiteAdministration(tx: Tx, siteIds: readonly string[]): Promise<void> {
  for (const id of [...siteIds].sort()) await tx.execute(dsql`select pg_advisory_xact_lock(hashtext(${`dentate:site-admins:${id}`}))`);
}

/** Of the given sites, those with an active administrator other than `exceptUserId`. */
export async function sitesWithAnotherActiveAdmin(tx: Tx, siteIds: readonly string[], exceptUserId: string): Promise<string[]> {
  if (siteIds.length === 0) return [];
  const rows = await tx
    .selectDistinct({ siteId: userSites.siteId })
    .from(userSites)
    .innerJoin(users, eq(users.id, userSites.userId))
    .where(and(inArray(userSites.siteId, [...siteIds]), eq(users.role, "admin"), eq(users.active, true), dsql`${users.id} <> ${exceptUserId}`));
  return rows.map((r) => r.siteId);
}

export async function siteNames(tx: Tx, siteIds: readonly string[]): Promise<string[]> {
  if (siteIds.length === 0) return [];
  const rows = await tx.select({ name: sites.name }).from(sites).where(inArray(sites.id, [...siteIds])).orderBy(sites.name);
  return rows.map((r) => r.name);
}

export async function setUserRoleAndActive(tx: Tx, userId: string, set: { role: Role; active: boolean }): Promise<void> {
  await tx.update(users).set(set).where(eq(users.id, userId));
}

/** Serialises first-administrator set-up (two commands at once cannot both pass the check). */
export async function lockFirstAdminSetup(tx: Tx): Promise<void> {
  await tx.execute(dsql`select pg_advisory_xact_lock(hashtext('dentate:first-admin'))`);
}

export async function activeAdministratorExists(tx: Tx): Promise<boolean> {
  const [row] = await tx.select({ id: users.id }).from(users).where(and(eq(users.role, "admin"), eq(users.active, true))).limit(1);
  return Boolean(row);
}

export async function siteByCode(tx: Tx, code: string) {
  const [site] = await tx.select({ id: sites.id, name: sites.name }).from(sites).where(eq(sites.code, code)).limit(1);
  return site ?? null;
}

export async function insertSite(tx: Tx, values: { code: string; name: string }): Promise<string> {
  const [site] = await tx.insert(sites).values(values).returning({ id: sites.id });
  return site!.id;
}

/** Open administrator invitations that no one sent (the set-up command's); returns how many. */
export async function revokeOpenSetupInvitations(tx: Tx, now: Date): Promise<number> {
  const rows = await tx
    .update(invitations)
    .set({ revokedAt: now })
    .where(and(eq(invitations.role, "admin"), isNull(invitations.invitedBy), isNull(invitations.usedAt), isNull(invitations.revokedAt)))
    .returning({ id: invitations.id });
  return rows.length;
}
