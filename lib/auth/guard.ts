import "server-only";
import { cache } from "react";
import { cookies } from "next/headers";
import type { SiteScope } from "@/db/queries/scope";
import { AppError } from "@/lib/errors";
import type { Role } from "@/lib/domain/vocab";
import { readCookie } from "./request-info";
import { checkSession, SESSION_COOKIE, sessionMaxHours, type SessionUser } from "./session";
import { assertServable } from "./servable";

export interface CurrentUser extends SessionUser {
  sessionId: string;
}

interface Resolved {
  user: CurrentUser | null;
  /** Set when the cookie named a session that just reached its absolute lifetime. */
  ended?: "lifetime";
}

async function resolve(token: string | null | undefined): Promise<Resolved> {
  if (!token) return { user: null };
  await assertServable();
  const check = await checkSession(token);
  if (!check.session) return { user: null, ended: check.ended };
  return { user: { ...check.session.user, sessionId: check.session.sessionId } };
}

/** For route handlers: the session comes from the request's own cookie header. */
export async function userFromRequest(req: Request): Promise<CurrentUser | null> {
  const r = await resolve(readCookie(req.headers, SESSION_COOKIE));
  if (r.ended === "lifetime") throw new AppError("unauthenticated", `Signed out after ${sessionMaxHours()} hours, the longest a sign-in lasts. Sign in again.`);
  return r.user;
}

/** For server components and actions: resolved once per request. */
export const currentSession = cache(async (): Promise<Resolved> => {
  const jar = await cookies();
  return resolve(jar.get(SESSION_COOKIE)?.value);
});

export async function getCurrentUser(): Promise<CurrentUser | null> {
  return (await currentSession()).user;
}

export function requireRole(user: CurrentUser | null, roles: readonly Role[] | "any"): CurrentUser {
  if (!user) throw new AppError("unauthenticated");
  if (roles !== "any" && !roles.includes(user.role)) throw new AppError("forbidden");
  return user;
}

export function scopeOf(user: CurrentUser): SiteScope {
  return { userId: user.id, siteIds: user.siteIds };
}

/** A record of another site answers exactly like a record that does not exist. */
export function requireSite(user: CurrentUser, siteId: string | null | undefined): void {
  if (!siteId || !user.siteIds.includes(siteId)) throw new AppError("not_found");
}
