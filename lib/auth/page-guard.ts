import "server-only";
import { headers } from "next/headers";
import { redirect } from "next/navigation";
import type { Role } from "@/lib/domain/vocab";
import { currentSession, type CurrentUser } from "./guard";
import { servableRefusal } from "./servable";
import { clientIp } from "./request-info";

/** For pages: no session → sign-in; a role that may not open the page → the no-access page. */
export async function requirePageRole(roles: readonly Role[] | "any"): Promise<CurrentUser> {
  // A server that must not serve shows why on the sign-in page, not an error page.
  if (await servableRefusal()) redirect("/sign-in");
  const { user, ended } = await currentSession();
  if (!user) redirect(ended === "lifetime" ? "/sign-in?ended=lifetime" : "/sign-in");
  if (roles !== "any" && !roles.includes(user.role)) redirect("/no-access");
  return user;
}

export const CLINICAL_ROLES = ["clinician", "reviewer", "admin"] as const satisfies readonly Role[];

/** The client's address for a page's audit row, by the same trusted-proxy rule as the API. */
export async function pageClientIp(): Promise<string> {
  return clientIp(await headers());
}
