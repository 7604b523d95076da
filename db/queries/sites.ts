import "server-only";
import { and, asc, eq, inArray } from "drizzle-orm";
import { db, type Tx } from "../client";
import { sites, users, userSites } from "../schema";

const columns = { id: sites.id, code: sites.code, name: sites.name, timeZone: sites.timeZone, postalCode: sites.postalCode, version: sites.version };

/** The sites among `siteIds`, by name. */
export function listSitesByIds(siteIds: string[]) {
  if (siteIds.length === 0) return Promise.resolve([]);
  return db.select(columns).from(sites).where(inArray(sites.id, siteIds)).orderBy(asc(sites.name));
}

export async function siteCodeTaken(tx: Tx, code: string, exceptId?: string): Promise<boolean> {
  const rows = await tx.select({ id: sites.id }).from(sites).where(eq(sites.code, code));
  return rows.some((r) => r.id !== exceptId);
}

export async function insertSiteWithMember(tx: Tx, values: { code: string; name: string; timeZone: string; postalCode: string | null }, memberId: string) {
  const [row] = await tx.insert(sites).values(values).returning(columns);
  await tx.insert(userSites).values({ userId: memberId, siteId: row!.id });
  return row!;
}

export async function siteForUpdate(tx: Tx, siteId: string) {
  const [row] = await tx.select(columns).from(sites).where(eq(sites.id, siteId)).for("update");
  return row ?? null;
}

export async function updateSiteRow(tx: Tx, siteId: string, set: Partial<{ code: string; name: string; timeZone: string; postalCode: string | null }>, version: number) {
  const [row] = await tx.update(sites).set({ ...set, version }).where(eq(sites.id, siteId)).returning(columns);
  return row!;
}

/** A user's sites, the user row locked so two changes to one person queue. */
export async function userSitesForUpdate(tx: Tx, userId: string) {
  const [user] = await tx.select({ id: users.id, role: users.role }).from(users).where(eq(users.id, userId)).for("update");
  if (!user) return null;
  const rows = await tx.select({ siteId: userSites.siteId }).from(userSites).where(eq(userSites.userId, userId));
  return { ...user, siteIds: rows.map((r) => r.siteId) };
}

export async function addUserSites(tx: Tx, userId: string, siteIds: string[]): Promise<void> {
  if (siteIds.length) await tx.insert(userSites).values(siteIds.map((siteId) => ({ userId, siteId }))).onConflictDoNothing();
}

export async function removeUserSites(tx: Tx, userId: string, siteIds: string[]): Promise<void> {
  if (siteIds.length) await tx.delete(userSites).where(and(eq(userSites.userId, userId), inArray(userSites.siteId, siteIds)));
}
