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
  const session = await lucia.createSession(userId, { createdAt: new Date() });
  return session.id;
}

const DEFAULT_MAX_HOURS = 7 * 24;

/**
 * However often a session slides (12 hours after the last use), it ends this many hours after
 * sign-in: DENTATE_SESSION_MAX_HOURS, default 168 (7 days).
 */
export function sessionMaxHours(env: Readonly<Record<string, string | undefined>> = process.env): number {
  const raw = env.DENTATE_SESSION_MAX_HOURS?.trim();
  if (!raw) return DEFAULT_MAX_HOURS;
  const n = Number(raw);
  if (!Number.isInteger(n) || n < 1) throw new Error(`DENTATE_SESSION_MAX_HOURS must be a whole number of hours, not "${raw}".`);
  return n;
}

export type SessionCheck = { session: ValidSession; ended?: undefined } | { session: null; ended?: "lifetime" };

/** The session, or why there is none: `ended: "lifetime"` when its absolute lifetime ran out. */
export async function checkSession(sessionId: string, now = new Date()): Promise<SessionCheck> {
  const { session, user } = await lucia.validateSession(sessionId);
  if (!session || !user) return { session: null };
  if (!user.active) {
    await lucia.invalidateUserSessions(user.id);
    return { session: null };
  }
  if (now.getTime() - session.createdAt.getTime() >= sessionMaxHours() * 3_600_000) {
    await lucia.invalidateSession(session.id);
    return { session: null, ended: "lifetime" };
  }
  return { session: { sessionId: session.id, user: user as SessionUser, refreshed: session.fresh } };
}

export async function validateSession(sessionId: string, now = new Date()): Promise<ValidSession | null> {
  return (await checkSession(sessionId, now)).session;
}

/** What the sign-in page says after a session reached its absolute lifetime. */
export function lifetimeNotice(hours = sessionMaxHours()): string {
  const days = hours % 24 === 0 ? ` (${hours / 24} day${hours === 24 ? "" : "s"})` : "";
  return `You were signed out after ${hours} hours${days}, the longest a sign-in lasts however busy the day. Sign in again to go on.`;
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
