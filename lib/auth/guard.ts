import "server-only";
import { cache } from "react";
import { cookies } from "next/headers";
import type { SiteScope } from "@/db/queries/scope";
import { AppError } from "@/lib/errors";
import type { Role } from "@/lib/domain/vocab";
import { readCookie } from "./request-info";
import { SESSION_COOKIE, validateSession, type SessionUser } from "./session";
import { assertServable } from "./servable";

export interface CurrentUser extends SessionUser {
  sessionId: string;
}

async function resolve(token: string | null | undefined): Promise<CurrentUser | null> {
  if (!token) return null;
  await assertServable();
  const valid = await validateSession(token);
  if (!valid) return null;
  return { ...valid.user, sessionId: valid.sessionId };
}

/** For route handlers: the session comes from the request's own cookie header. */
export function userFromRequest(req: Request): Promise<CurrentUser | null> {
  return resolve(readCookie(req.headers, SESSION_COOKIE));
}

/** For server components and actions: resolved once per request. */
export const getCurrentUser = cache(async (): Promise<CurrentUser | null> => {
  const jar = await cookies();
  return resolve(jar.get(SESSION_COOKIE)?.value);
});

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
