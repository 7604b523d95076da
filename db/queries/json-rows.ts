import { sql as dsql, type AnyColumn, type SQL } from "drizzle-orm";

/**
 * A subquery's rows as one JSON array of arrays (`[]` when there are none), for reading several
 * lists in one statement: the driver then parses one value per list instead of building a result
 * row by row. `rest` is the subquery after its select list (from … where …). JSON carries dates as
 * `YYYY-MM-DD` strings (drizzle's own form for date columns) and timestamps as ISO text: turn those
 * into Date where the caller expects one.
 */
export function rowsOf<T extends unknown[]>(columns: (AnyColumn | SQL)[], rest: SQL, orderBy?: SQL) {
  return dsql<T[]>`(select coalesce(json_agg(json_build_array(${dsql.join(columns, dsql`, `)})${orderBy ? dsql` order by ${orderBy}` : dsql``}), '[]') ${rest})`;
}
