import "server-only";
import { Lucia, TimeSpan } from "lucia";
import type { DatabaseSession, DatabaseUser } from "lucia";
import { DrizzlePostgreSQLAdapter } from "@lucia-auth/adapter-drizzle";
import { db } from "@/db/client";
import { sessions, users } from "@/db/schema";
import { findSessionWithUser } from "@/db/queries/users";
import type { Role } from "@/lib/domain/vocab";
import type { DisplayConvention } from "@/lib/geometry";

/**
 * The drizzle adapter, but the session check every request makes is one statement that also
 * brings the user's sites (the stock one reads the whole user row, password hash included, and
 * the sites would be a second round trip).
 */
class DentateAdapter extends DrizzlePostgreSQLAdapter {
  override async getSessionAndUser(sessionId: string): Promise<[DatabaseSession | null, DatabaseUser | null]> {
    const row = await findSessionWithUser(sessionId);
    if (!row) return [null, null];
    const { sessionId: id, userId, expiresAt, createdAt, ...attributes } = row;
    return [
      { id, userId, expiresAt, attributes: { createdAt } },
      { id: userId, attributes },
    ];
  }
}

// The only file that imports Lucia: swap the library here and nothing else changes.
const adapter = new DentateAdapter(db, sessions, users);

export const SESSION_COOKIE = "dentate_session";

export const lucia = new Lucia(adapter, {
  // A clinic day; Lucia extends an active session when half of it has passed.
  sessionExpiresIn: new TimeSpan(12, "h"),
  sessionCookie: { name: SESSION_COOKIE, expires: false, attributes: { sameSite: "lax", secure: false } },
  getSessionAttributes: (a) => ({ createdAt: a.createdAt }),
  getUserAttributes: (a) => ({
    email: a.email,
    displayName: a.displayName,
    role: a.role,
    active: a.active,
    displayConvention: a.displayConvention,
    siteIds: a.siteIds,
  }),
});

declare module "lucia" {
  interface Register {
    Lucia: typeof lucia;
    DatabaseSessionAttributes: { createdAt: Date };
    DatabaseUserAttributes: {
      email: string;
      displayName: string;
      role: Role;
      active: boolean;
      displayConvention: DisplayConvention;
      siteIds: string[];
    };
  }
}
