import "server-only";
import { Lucia, TimeSpan } from "lucia";
import { DrizzlePostgreSQLAdapter } from "@lucia-auth/adapter-drizzle";
import { db } from "@/db/client";
import { sessions, users } from "@/db/schema";
import type { Role } from "@/lib/domain/vocab";

// The only file that imports Lucia: swap the library here and nothing else changes.
const adapter = new DrizzlePostgreSQLAdapter(db, sessions, users);

export const SESSION_COOKIE = "dentate_session";

export const lucia = new Lucia(adapter, {
  // A clinic day; Lucia extends an active session when half of it has passed.
  sessionExpiresIn: new TimeSpan(12, "h"),
  sessionCookie: { name: SESSION_COOKIE, expires: false, attributes: { sameSite: "lax", secure: false } },
  getUserAttributes: (a) => ({
    email: a.email,
    displayName: a.displayName,
    role: a.role,
    active: a.active,
    displayConvention: a.displayConvention,
  }),
});

declare module "lucia" {
  interface Register {
    Lucia: typeof lucia;
    DatabaseUserAttributes: {
      email: string;
      displayName: string;
      role: Role;
      active: boolean;
      displayConvention: "lithotomy" | "prone_jackknife" | "left_lateral";
    };
  }
}
