import "server-only";
import postgres from "postgres";
import { sql as primary } from "./client";

// Research reads (exports, study dashboard, quality panel, FHIR bundles) go to a streaming replica
// when DATABASE_REPLICA_URL names one, so a statistician's export does not compete with the exam
// room for the primary. Writes, and the audit row of an export, always go to the primary (db/client).
//
// Before a research read the replica is asked how far behind it is. When it cannot be reached, or
// its replay lags the primary by more than DATABASE_REPLICA_MAX_LAG_S seconds (default 30), the
// read goes to the primary instead and a line is logged: research figures are never older than the
// limit, and an outage of the replica is not an outage of research. The answer is kept for
// DATABASE_REPLICA_CHECK_MS (default 1000) so a burst of reads costs one check.

interface Health {
  ok: boolean;
  reason: string;
  at: number;
}

let replica: postgres.Sql | null = null;
let replicaUrl = "";
let health: Health | null = null;
let lastLog = 0;
let lastLogged = "";

function replicaPool(url: string): postgres.Sql {
  if (replica && replicaUrl === url) return replica;
  const old = replica;
  if (old) void old.end({ timeout: 5 }).catch(() => {});
  health = null;
  replicaUrl = url;
  const socketDir = process.env.DATABASE_REPLICA_SOCKET_DIR || undefined;
  replica = postgres(url, {
    ...(socketDir ? { host: socketDir } : {}),
    max: Number(process.env.DATABASE_REPLICA_POOL_MAX ?? 5),
    idle_timeout: 30,
    connect_timeout: 2,
    prepare: process.env.DATABASE_PREPARE !== "false",
    onnotice: () => {},
  });
  // The same type parsers as the primary's client (drizzle installs its own there): dates as text.
  Object.assign(replica.options.parsers, primary.options.parsers);
  Object.assign(replica.options.serializers, primary.options.serializers);
  return replica;
}

function numberSetting(name: string, fallback: number): number {
  const v = Number(process.env[name]);
  return process.env[name] !== undefined && process.env[name] !== "" && Number.isFinite(v) ? v : fallback;
}

/**
 * How far the replica's replay is behind, in seconds: zero when it has replayed all it received
 * (an idle primary sends nothing, so the time since the last replayed transaction is no lag),
 * otherwise the time since the last transaction it replayed. A server that is not a standby (a
 * provider's reader endpoint that hides it) counts as current.
 */
async function check(pool: postgres.Sql): Promise<Health> {
  const limit = numberSetting("DATABASE_REPLICA_MAX_LAG_S", 30);
  try {
    const [row] = await pool<{ lag: number | null }[]>`
      SELECT CASE WHEN NOT pg_is_in_recovery() THEN 0
        WHEN pg_last_wal_receive_lsn() IS NOT DISTINCT FROM pg_last_wal_replay_lsn() THEN 0
        ELSE coalesce(extract(epoch FROM clock_timestamp() - pg_last_xact_replay_timestamp()), 0) END::float8 AS lag`;
    const lag = row?.lag ?? 0;
    if (lag > limit) return { ok: false, reason: `the replica lags ${lag.toFixed(1)} s (limit ${limit} s)`, at: Date.now() };
    return { ok: true, reason: "", at: Date.now() };
  } catch (err) {
    return { ok: false, reason: `the replica is unreachable (${err instanceof Error ? err.message : String(err)})`, at: Date.now() };
  }
}

function logFallback(reason: string): void {
  // One line when the reason changes, then at most one a minute while it lasts.
  const kind = reason.split(" (")[0]!.replace(/[\d.]+ s/, "");
  if (kind === lastLogged && Date.now() - lastLog < 60_000) return;
  lastLogged = kind;
  lastLog = Date.now();
  console.warn(`[dentate] research reads use the primary: ${reason}`);
}

/** The client a research read should use: the replica when it is set, reachable and current enough. */
export async function researchSql(): Promise<postgres.Sql> {
  const url = process.env.DATABASE_REPLICA_URL;
  if (!url) return primary;
  const pool = replicaPool(url);
  const ttl = numberSetting("DATABASE_REPLICA_CHECK_MS", 1000);
  // A failed check is kept at least 5 s: an unreachable host costs a connect timeout each time.
  const keep = health && !health.ok && ttl > 0 ? Math.max(ttl, 5000) : ttl;
  if (!health || Date.now() - health.at >= keep) health = await check(pool);
  if (health.ok) {
    lastLogged = "";
    return pool;
  }
  logFallback(health.reason);
  return primary;
}

/** Ends the replica's pool (scripts and tests that exit). */
export async function endReplica(): Promise<void> {
  const p = replica;
  replica = null;
  health = null;
  if (p) await p.end({ timeout: 5 });
}
