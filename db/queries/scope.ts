import { inArray, sql, type Column, type SQL } from "drizzle-orm";

/** The sites a caller may see. Every query that reads patient data takes one. */
export interface SiteScope {
  userId: string;
  siteIds: string[];
}

/** `column IN (the caller's sites)`; a caller with no site sees nothing. */
export function inScope(column: Column, scope: SiteScope): SQL {
  return scope.siteIds.length ? inArray(column, scope.siteIds) : sql`false`;
}
