import "server-only";
import { and, eq, inArray } from "drizzle-orm";
import { db } from "../client";
import { users, userSites } from "../schema";

/** Clinicians who can be responsible for patients at the caller's sites, for the filter. */
export async function listClinicians(siteIds: string[]) {
  if (siteIds.length === 0) return [];
  return db
    .selectDistinct({ id: users.id, displayName: users.displayName })
    .from(users)
    .innerJoin(userSites, eq(userSites.userId, users.id))
    .where(and(inArray(userSites.siteId, siteIds), inArray(users.role, ["clinician", "admin"])))
    .orderBy(users.displayName);
}


/** Names and addresses of the given users (the reminder digests). */
export async function usersForMail(ids: string[]) {
  if (ids.length === 0) return [];
  return db.select({ id: users.id, email: users.email, displayName: users.displayName, active: users.active }).from(users).where(inArray(users.id, ids));
}
