// Who may change another person's role or active flag. A role applies at every site a person
// works at, so a change is made only by someone who administers all of that person's sites; and
// no change may leave one of those sites without an active administrator (nobody could then
// invite, deactivate or reset anyone there).

import type { Role } from "@/lib/domain/vocab";

export interface AccountChange {
  /** Sites of the administrator making the change. */
  adminSiteIds: readonly string[];
  target: { siteIds: readonly string[]; role: Role; active: boolean };
  after: { role: Role; active: boolean };
  /** Of the target's sites, those with an active administrator other than the target. */
  sitesWithAnotherAdmin: readonly string[];
}

export type AccountChangeRefusal =
  | { code: "forbidden"; siteIds: string[] }
  | { code: "conflict"; siteIds: string[] };

export function accountChangeRefusal(c: AccountChange): AccountChangeRefusal | null {
  const notMine = c.target.siteIds.filter((s) => !c.adminSiteIds.includes(s));
  if (notMine.length) return { code: "forbidden", siteIds: notMine };
  const isAdminNow = c.target.role === "admin" && c.target.active;
  const isAdminAfter = c.after.role === "admin" && c.after.active;
  if (isAdminNow && !isAdminAfter) {
    const orphaned = c.target.siteIds.filter((s) => !c.sitesWithAnotherAdmin.includes(s));
    if (orphaned.length) return { code: "conflict", siteIds: orphaned };
  }
  return null;
}
