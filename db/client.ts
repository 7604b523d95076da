import "server-only";
import { fillPlaceholders, type SQL } from "drizzle-orm";
import { PgDialect } from "drizzle-orm/pg-core";
import { drizzle } from "drizzle-orm/postgres-js";
import postgres from "postgres";
import * as schema from "./schema";

function databaseUrl(): string {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error("DATABASE_URL is not set (scripts/start.sh and scripts/test.sh set it)");
  return url;
}

// Query listeners: instrumentation (slow-query logging, query counting in tests and benchmarks).
// postgres.js's `debug` hook, which calls them, is installed only while one listens: with it the
// driver also captures a stack trace (an Error) for every query it builds, a measurable share of a
// request's CPU (npm run bench, API under load), and makes a failed query's parameters enumerable
// (so they would be printed with the error).
const queryListeners = new Set<(query: string) => void>();
const callListeners = (_connection: number, query: string) => {
  for (const l of queryListeners) l(query);
};
function applyListeners(p: postgres.Sql | null): void {
  // The driver reads the option as each query is built, so a change applies to the next query.
  if (p) (p.options as { debug: unknown }).debug = queryListeners.size ? callListeners : false;
}
export function onQuery(listener: (query: string) => void): () => void {
  queryListeners.add(listener);
  applyListeners(current);
  return () => {
    queryListeners.delete(listener);
    applyListeners(current);
  };
}

// DATABASE_SOCKET_DIR: when the database runs on the same machine (scripts/start.sh, test.sh and
// bench.sh), the pool connects through its Unix socket in that directory (the port in DATABASE_URL
// names the socket file) instead of TCP on loopback: a query then costs this process about half
// the CPU (no TCP stack on either side; measured with npm run bench, API under load). Unset, the
// host in DATABASE_URL is used, as a managed or remote database needs.
const socketDir = process.env.DATABASE_SOCKET_DIR || undefined;

function openPool(): postgres.Sql {
  const p = postgres(databaseUrl(), {
    ...(socketDir ? { host: socketDir } : {}),
    max: Number(process.env.DATABASE_POOL_MAX ?? 10),
    idle_timeout: 30,
    connect_timeout: 5,
    // Tagged-template queries are prepared by default; DATABASE_PREPARE=false (below) turns it off.
    prepare: process.env.DATABASE_PREPARE !== "false",
    // Reconnect attempts back off to at most 1 s (the driver's default climbs to 20 s), so
    // requests queued during a short outage are served soon after the database is back.
    backoff: (attempt: number) => Math.min(0.05 * 2 ** attempt, 1),
    onnotice: () => {},
    onclose: () => schedulePoolSwap(),
  });
  applyListeners(p);
  return p;
}

// postgres.js 3.4.x can leave a pooled connection unusable after the server goes away mid-
// transaction (its rollback is queued on a closed socket; the stale write buffer then swallows
// the next StartupMessage, so that connection only ever times out: upstream issues #1066/#1154).
// So whenever a connection closes, later queries go to a fresh pool; the old one is ended once
// what it already accepted has had time to finish. Idle closes swap too, which costs nothing.
let current: postgres.Sql | null = null;
let firstPool: postgres.Sql | null = null;
let lastSwap = 0;
let pendingSwap: NodeJS.Timeout | null = null;
let shuttingDown = false;
function schedulePoolSwap(): void {
  if (shuttingDown || pendingSwap || !current) return;
  // At most one swap a second, but never drop one: a close inside the window swaps at its end.
  const wait = Math.max(0, lastSwap + 1_000 - Date.now());
  pendingSwap = setTimeout(swapPool, wait);
  pendingSwap.unref();
}
function swapPool(): void {
  pendingSwap = null;
  if (shuttingDown || !current) return;
  lastSwap = Date.now();
  const old = current;
  current = openPool();
  // drizzle installs its own type parsers on the client it was given; the new pool needs them too.
  if (firstPool) {
    Object.assign(current.options.parsers, firstPool.options.parsers);
    Object.assign(current.options.serializers, firstPool.options.serializers);
  }
  setTimeout(() => void old.end({ timeout: 5 }).catch(() => {}), 30_000).unref();
}
function pool(): postgres.Sql {
  if (!current) firstPool = current = openPool();
  return current;
}

// The exported client always forwards to the current pool.
const forwarding = new Proxy((() => {}) as unknown as postgres.Sql, {
  apply: (_t, _this, args) => (pool() as unknown as (...a: unknown[]) => unknown)(...args),
  get: (_t, prop) => {
    if (prop === "end") shuttingDown = true;
    return Reflect.get(pool(), prop);
  },
  set: (_t, prop, value) => Reflect.set(pool(), prop, value),
  has: (_t, prop) => Reflect.has(pool(), prop),
});

// One client per process, reused across hot reloads in development.
const globalForDb = globalThis as unknown as { __dentateSql?: postgres.Sql };

export const sql: postgres.Sql = globalForDb.__dentateSql ?? forwarding;
if (process.env.NODE_ENV !== "production") globalForDb.__dentateSql = sql;

// drizzle asks postgres.js for unnamed statements, which PostgreSQL parses and plans on every call
// and which cost an extra round trip (describe, then bind) whenever they carry parameters. The app
// repeats the same few statements on every request, so they are prepared instead: postgres.js keeps
// each one per connection, keyed by its text, and a later call sends only bind and execute. Bulk
// statements (many rows of values, long IN lists) vary in text with their size and would pile up
// in that per-connection cache, so above a number of parameters they stay unnamed.
// DATABASE_PREPARE=false turns preparing off, for a pooler that cannot carry prepared statements
// across transactions (PgBouncer in transaction mode before 1.21, or without max_prepared_statements).
const MAX_PREPARED_PARAMS = process.env.DATABASE_PREPARE === "false" ? -1 : 64;
function preparing(target: postgres.Sql): postgres.Sql {
  type Fn = (...a: unknown[]) => unknown;
  return new Proxy(target, {
    apply: (t, _this, args) => (t as unknown as Fn)(...args),
    get: (t, prop) => {
      if (prop === "unsafe") {
        return (query: string, params: unknown[] = [], options: Record<string, unknown> = {}) =>
          (t.unsafe as unknown as Fn)(query, params, { ...options, prepare: params.length <= MAX_PREPARED_PARAMS });
      }
      if (prop === "begin" || prop === "savepoint") {
        // The transaction's own client (one reserved connection) prepares the same way.
        return (...args: unknown[]) => {
          const body = args.pop() as (tx: postgres.Sql) => unknown;
          return (Reflect.get(t, prop) as Fn)(...args, (tx: postgres.Sql) => body(preparing(tx)));
        };
      }
      return Reflect.get(t, prop);
    },
  });
}

export const db = drizzle(preparing(sql), { schema });
export type Db = typeof db;
export type Tx = Parameters<Parameters<Db["transaction"]>[0]>[0];

/**
 * A statement the app runs on most requests, built once: drizzle renders its SQL when the module
 * loads, and each call only fills in its `dsql.placeholder(...)` values and runs it, on the pool
 * or inside a transaction (the runner passed). Building a query is a good share of a request's
 * CPU otherwise (`npm run bench`, API under load).
 */
export function prepared<Q extends { execute(values?: Record<string, unknown>): Promise<unknown> }>(build: (run: Db) => { prepare(name: string): Q }) {
  const onPool = build(db).prepare("dentate");
  return (run: Db | Tx, values?: Record<string, unknown>): ReturnType<Q["execute"]> => {
    // drizzle's prepared query keeps the client it was built on; a transaction's differs.
    const client = (run._.session as unknown as { client: unknown }).client;
    const query = run === db ? onPool : (Object.create(onPool, { client: { value: client } }) as Q);
    return query.execute(values) as ReturnType<Q["execute"]>;
  };
}

const sqlDialect = new PgDialect();

/**
 * `prepared` for a statement written as SQL (data-modifying CTEs, which drizzle's builders do not
 * express): rendered once, with `dsql.placeholder("name")` for its values; each call fills them in
 * and runs it on the pool or in the transaction given. Rows come back as the statement names its
 * columns (alias them as the caller's fields).
 */
export function preparedSql<Row>(statement: SQL): (run: Db | Tx, values: Record<string, unknown>) => Promise<Row[]> {
  const query = sqlDialect.sqlToQuery(statement);
  return async (run, values) => {
    const client = (run._.session as unknown as { client: postgres.Sql }).client;
    const rows = await client.unsafe(query.sql, fillPlaceholders(query.params, values) as postgres.ParameterOrJSON<never>[]);
    return rows as unknown as Row[];
  };
}

/**
 * Runs a one-off script (seed, bench fixture, daily job) and closes its pool afterwards, so the
 * process can exit; a failure is printed and exits 1. `pool` is the script's own postgres.js
 * client when it has one.
 */
export function runScript(main: () => Promise<unknown>, pool: { end(): Promise<void> } = sql): void {
  main().then(
    () => pool.end(),
    async (err: unknown) => {
      console.error(err);
      await pool.end();
      process.exit(1);
    },
  );
}
