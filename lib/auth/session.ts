import "server-only";
import { lucia, SESSION_COOKIE } from "./lucia";
import type { DisplayConvention } from "@/lib/geometry";

export { SESSION_COOKIE };

export interface SessionUser {
  id: string;
  email: string;
  displayName: string;
  role: "clinician" | "reviewer" | "research_nurse" | "admin";
  active: boolean;
  displayConvention: DisplayConvention;
  /** The sites the user works at, read with the session. */
  siteIds: string[];
}

export interface ValidSession {
  sessionId: string;
  user: SessionUser;
  /** A fresh cookie value when the session was extended, to be written back. */
  refreshed: boolean;
}

export async function createSession(userId: string): Promise<string> {
  const session = await lucia.createSession(userId, {});
  return session.id;
}

export async function validateSession(sessionId: string): Promise<ValidSession | null> {
  const { session, user } = await lucia.validateSession(sessionId);
  if (!session || !user) return null;
  if (!user.active) {
    await lucia.invalidateUserSessions(user.id);
    return null;
  }
  return { sessionId: session.id, user: user as SessionUser, refreshed: session.fresh };
}

export function invalidateSession(sessionId: string): Promise<void> {
  return lucia.invalidateSession(sessionId);
}

export function invalidateUserSessions(userId: string): Promise<void> {
  return lucia.invalidateUserSessions(userId);
}

export interface CookieSpec {
  name: string;
  value: string;
  attributes: { httpOnly: true; sameSite: "lax"; secure: boolean; path: "/"; maxAge?: number };
}

/** httpOnly, SameSite=Lax, Secure whenever the request came over https. */
export function sessionCookie(sessionId: string, secure: boolean): CookieSpec {
  return { name: SESSION_COOKIE, value: sessionId, attributes: { httpOnly: true, sameSite: "lax", secure, path: "/" } };
}

export function blankSessionCookie(secure: boolean): CookieSpec {
  return { name: SESSION_COOKIE, value: "", attributes: { httpOnly: true, sameSite: "lax", secure, path: "/", maxAge: 0 } };
}

export function serializeCookie(c: CookieSpec): string {
  const parts = [`${c.name}=${c.value}`, "Path=/", "HttpOnly", "SameSite=Lax"];
  if (c.attributes.secure) parts.push("Secure");
  if (c.attributes.maxAge !== undefined) parts.push(`Max-Age=${c.attributes.maxAge}`);
  return parts.join("; ");
}
