import "server-only";
import { drizzle } from "drizzle-orm/postgres-js";
import postgres from "postgres";
import * as schema from "./schema";

function databaseUrl(): string {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error("DATABASE_URL is not set (scripts/start.sh and scripts/test.sh set it)");
  return url;
}

// Query listeners: instrumentation (slow-query logging, query counting in tests and benchmarks).
const queryListeners = new Set<(query: string) => void>();
export function onQuery(listener: (query: string) => void): () => void {
  queryListeners.add(listener);
  return () => queryListeners.delete(listener);
}

// One pool per process, reused across hot reloads in development.
const globalForDb = globalThis as unknown as { __dentateSql?: postgres.Sql };

export const sql: postgres.Sql =
  globalForDb.__dentateSql ??
  postgres(databaseUrl(), {
    max: Number(process.env.DATABASE_POOL_MAX ?? 10),
    idle_timeout: 30,
    connect_timeout: 5,
    onnotice: () => {},
    debug: (_connection, query) => {
      for (const l of queryListeners) l(query);
    },
  });
if (process.env.NODE_ENV !== "production") globalForDb.__dentateSql = sql;

export const db = drizzle(sql, { schema });
export type Db = typeof db;
export type Tx = Parameters<Parameters<Db["transaction"]>[0]>[0];
