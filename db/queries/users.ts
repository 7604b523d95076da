import "server-only";
import { and, count, eq, inArray, sql as dsql } from "drizzle-orm";
import { db, type Tx } from "../client";
import { rateLimits, sessions, users, userSites } from "../schema";
import type { DisplayConvention } from "@/lib/geometry";

/** The only query that reads a password hash; it never leaves the auth service. */
export async function findUserCredentials(email: string) {
  const [row] = await db
    .select({ id: users.id, passwordHash: users.passwordHash, active: users.active, role: users.role })
    .from(users)
    .where(eq(users.email, email.trim().toLowerCase()))
    .limit(1);
  return row ?? null;
}

// Built once (every request runs it), executed with the session id as its only parameter.
const sessionWithUser = db
  .select({
    sessionId: sessions.id,
    userId: sessions.userId,
    expiresAt: sessions.expiresAt,
    createdAt: sessions.createdAt,
    email: users.email,
    displayName: users.displayName,
    role: users.role,
    active: users.active,
    displayConvention: users.displayConvention,
    siteIds: dsql<string[]>`array(select ${userSites.siteId}::text from ${userSites} where ${userSites.userId} = ${users.id} order by 1)`,
  })
  .from(sessions)
  .innerJoin(users, eq(users.id, sessions.userId))
  .where(eq(sessions.id, dsql.placeholder("sessionId")))
  .prepare("session_with_user");

/**
 * What every authenticated request needs, in one statement: the session, its user (never the
 * password hash) and the user's sites. Read afresh each time: nothing is kept in process, so a
 * deactivated user or a removed site membership takes effect on the next request.
 */
export async function findSessionWithUser(sessionId: string) {
  const [row] = await sessionWithUser.execute({ sessionId });
  return row ?? null;
}

export async function getUserPublic(userId: string) {
  const [row] = await db
    .select({ id: users.id, email: users.email, displayName: users.displayName, role: users.role, active: users.active })
    .from(users)
    .where(and(eq(users.id, userId)))
    .limit(1);
  return row ?? null;
}

export async function setDisplayConvention(userId: string, convention: DisplayConvention) {
  await db.update(users).set({ displayConvention: convention }).where(eq(users.id, userId));
}

/**
 * Fixed-window counter shared by every app instance. Returns the count in the current window
 * after this hit.
 */
export async function hitRateLimit(key: string, windowSeconds: number): Promise<number> {
  const rows = await db
    .insert(rateLimits)
    .values({ key, windowStart: new Date(), count: 1 })
    .onConflictDoUpdate({
      target: rateLimits.key,
      set: {
        count: dsql`case when ${rateLimits.windowStart} < now() - make_interval(secs => ${windowSeconds}) then 1 else ${rateLimits.count} + 1 end`,
        windowStart: dsql`case when ${rateLimits.windowStart} < now() - make_interval(secs => ${windowSeconds}) then now() else ${rateLimits.windowStart} end`,
      },
    })
    .returning({ count: rateLimits.count });
  return rows[0]?.count ?? 1;
}

/**
 * Counts one attempt under `key` unless it comes too soon: within `delays[count]` seconds of the
 * previous counted attempt (the last entry holds for larger counts), or once `hardLimit` attempts
 * are counted. Fixed windows of `windowSeconds`. Atomic per key (the upsert locks the row), so a
 * burst cannot slip past. Returns the count after this attempt, or null with the count that
 * refused it.
 */
export async function claimAttempt(tx: Tx, a: { key: string; windowSeconds: number; delays: number[]; hardLimit: number | null; now: Date }): Promise<{ allowed: boolean; count: number }> {
  const now = dsql`${a.now.toISOString()}::timestamptz`;
  const expired = dsql`${rateLimits.windowStart} <= ${now} - make_interval(secs => ${a.windowSeconds})`;
  const delays = dsql`${`{${a.delays.join(",")}}`}::int[]`;
  const rows = await tx
    .insert(rateLimits)
    .values({ key: a.key, windowStart: a.now, count: 1, lastHitAt: a.now })
    .onConflictDoUpdate({
      target: rateLimits.key,
      set: {
        count: dsql`case when ${expired} then 1 else ${rateLimits.count} + 1 end`,
        windowStart: dsql`case when ${expired} then ${now} else ${rateLimits.windowStart} end`,
        lastHitAt: now,
      },
      setWhere: dsql`${expired} or (${rateLimits.count} < ${a.hardLimit ?? 2147483647}
        and ${rateLimits.lastHitAt} + make_interval(secs => (${delays})[least(${rateLimits.count}, ${a.delays.length - 1}) + 1]) <= ${now})`,
    })
    .returning({ count: rateLimits.count });
  if (rows[0]) return { allowed: true, count: rows[0].count };
  const [held] = await tx.select({ count: rateLimits.count }).from(rateLimits).where(eq(rateLimits.key, a.key));
  return { allowed: false, count: held?.count ?? 0 };
}

/** Staff who share at least one site with the caller. Never returns a password hash. */
export async function listStaff(siteIds: string[]) {
  if (siteIds.length === 0) return [];
  return db
    .select({
      id: users.id, email: users.email, displayName: users.displayName, role: users.role, active: users.active,
      siteIds: dsql<string[]>`(select coalesce(array_agg(us.site_id::text order by us.site_id), '{}') from user_sites us where us.user_id = ${users.id})`,
    })
    .from(users)
    .where(dsql`exists (select 1 from user_sites us where us.user_id = ${users.id} and us.site_id in ${siteIds})`)
    .orderBy(users.displayName);
}

/** Forget one counted attempt (a successful sign-in does not count against its address). */
export async function releaseRateLimit(key: string): Promise<void> {
  await db.update(rateLimits).set({ count: dsql`greatest(${rateLimits.count} - 1, 0)` }).where(eq(rateLimits.key, key));
}

/** Start the window afresh (a successful sign-in clears the account's failed attempts). */
export async function resetRateLimit(key: string): Promise<void> {
  await db.delete(rateLimits).where(eq(rateLimits.key, key));
}

/** How many of the given accounts exist. */
export async function countAccountsByEmail(emails: readonly string[]): Promise<number> {
  const [{ n }] = await db.select({ n: count() }).from(users).where(inArray(users.email, [...emails]));
  return n;
}
