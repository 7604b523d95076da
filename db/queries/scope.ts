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

/**
 * inScope for a statement built once (`prepared` in db/client.ts): the sites are one parameter,
 * `siteIds`, an array whatever their number; pass `siteIdsParam(scope)` as its value. Empty, it
 * matches nothing, as inScope does.
 */
export function inScopeParam(column: Column): SQL {
  return sql`${column} = any(${sql.placeholder("siteIds")}::uuid[])`;
}

/** The value of inScopeParam's `siteIds` placeholder: a PostgreSQL array literal of the site ids. */
export function siteIdsParam(scope: SiteScope): string {
  return pgArrayLiteral(scope.siteIds);
}

/** A PostgreSQL array literal (text form) of these values, each quoted; null stays NULL. */
export function pgArrayLiteral(values: readonly (string | null)[]): string {
  return `{${values.map((v) => (v === null ? "NULL" : `"${v.replace(/["\\]/g, "\\$&")}"`)).join(",")}}`;
}
