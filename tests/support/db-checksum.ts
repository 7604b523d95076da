// A fingerprint of every application table, to prove a refused request wrote nothing.
// Left out, because they legitimately change on a refused request:
//   audit_events  - refusals and reads are audited on purpose (append-only log);
//   rate_limits   - every attempt, refused or not, counts against the limiter;
//   sessions      - Lucia may extend a session's expiry while validating it.
import { sql } from "@/db/client";

export const CHANGING_TABLES = new Set(["audit_events", "rate_limits", "sessions"]);

export async function tableChecksums(): Promise<Record<string, string>> {
  const tables = await sql<{ name: string }[]>`
    select table_name as name from information_schema.tables
    where table_schema = 'public' and table_type = 'BASE TABLE' order by table_name`;
  const names = tables.map((t) => t.name).filter((n) => !CHANGING_TABLES.has(n));
  const parts = names.map((n) => `select '${n}' as name, md5(coalesce(string_agg(t::text, '|' order by t::text), '')) as sum from "${n}" t`);
  const rows = await sql.unsafe<{ name: string; sum: string }[]>(parts.join(" union all "));
  return Object.fromEntries(rows.map((r) => [r.name, r.sum]));
}

/** Names of the tables whose checksum differs. */
export function changedTables(before: Record<string, string>, after: Record<string, string>): string[] {
  return Object.keys({ ...before, ...after }).filter((k) => before[k] !== after[k]).sort();
}
