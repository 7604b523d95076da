// Backup and restore round trip: scripts/backup.sh dumps the test database, scripts/restore.sh
// loads it into a new database, and every table must come back with the same rows. A table's
// fingerprint is its row count plus the md5 of all its rows rendered as text in sorted order,
// computed by PostgreSQL itself on both sides (the source database is the reference, not code
// of ours). The restored database is dropped at the end.
import { execFileSync } from "node:child_process";
import { mkdtempSync, rmSync, statSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import postgres from "postgres";
import { afterAll, describe, expect, it } from "vitest";
import { dropTestDatabase } from "../support/drop-database";

const SOURCE_URL = process.env.DATABASE_URL!;
const ROOT = path.resolve(__dirname, "../..");
const RESTORED_DB = `dentate_restore_${process.pid}_${Date.now() % 1_000_000}`;
const workDir = mkdtempSync(path.join(tmpdir(), "dentate-backup-"));
const dumpFile = path.join(workDir, "round-trip.dump");

function urlForDb(url: string, dbName: string): string {
  const u = new URL(url);
  u.pathname = `/${dbName}`;
  return u.toString();
}

type Fingerprint = Map<string, { rows: number; md5: string }>;

async function fingerprint(sql: postgres.Sql): Promise<Fingerprint> {
  const tables = await sql<{ schema: string; name: string }[]>`
    select table_schema as schema, table_name as name from information_schema.tables
    where table_type = 'BASE TABLE' and table_schema not in ('pg_catalog', 'information_schema')
    order by 1, 2`;
  const out: Fingerprint = new Map();
  for (const t of tables) {
    const ident = `"${t.schema.replace(/"/g, '""')}"."${t.name.replace(/"/g, '""')}"`;
    const [r] = await sql.unsafe<{ rows: number; md5: string | null }[]>(
      `select count(*)::int as rows, md5(coalesce(string_agg(x.t, E'\\n' order by x.t), '')) as md5 from (select r::text as t from ${ident} r) x`,
    );
    out.set(`${t.schema}.${t.name}`, { rows: r!.rows, md5: r!.md5 ?? "" });
  }
  return out;
}

async function schemaObjects(sql: postgres.Sql) {
  const [r] = await sql<{ indexes: number; triggers: number; constraints: number }[]>`
    select (select count(*)::int from pg_indexes where schemaname not in ('pg_catalog', 'information_schema')) as indexes,
           (select count(*)::int from pg_trigger t join pg_class c on c.oid = t.tgrelid join pg_namespace n on n.oid = c.relnamespace
              where not t.tgisinternal and n.nspname not in ('pg_catalog', 'information_schema')) as triggers,
           (select count(*)::int from pg_constraint c join pg_namespace n on n.oid = c.connamespace
              where n.nspname not in ('pg_catalog', 'information_schema')) as constraints`;
  return r!;
}

const admin = postgres(urlForDb(SOURCE_URL, "postgres"), { max: 1, onnotice: () => {} });
let restored: postgres.Sql | null = null;

afterAll(async () => {
  await restored?.end({ timeout: 5 });
  await dropTestDatabase(admin, RESTORED_DB);
  await admin.end({ timeout: 5 });
  rmSync(workDir, { recursive: true, force: true });
});

describe("backup and restore", () => {
  it("round-trips every table of the database: same row counts, same checksums, same triggers", async () => {
    const source = postgres(SOURCE_URL, { max: 1, onnotice: () => {} });
    const before = await fingerprint(source);
    const beforeObjects = await schemaObjects(source);
    await source.end({ timeout: 5 });
    // The comparison means something only on a database that holds data.
    expect(before.get("public.patients")?.rows ?? 0).toBeGreaterThan(0);

    const env = { ...process.env, DATABASE_URL: SOURCE_URL };
    execFileSync("bash", [path.join(ROOT, "scripts/backup.sh"), dumpFile], { env, stdio: "pipe", timeout: 60_000 });
    expect(statSync(dumpFile).size).toBeGreaterThan(0);
    const out = execFileSync("bash", [path.join(ROOT, "scripts/restore.sh"), dumpFile, RESTORED_DB], { env, stdio: "pipe", timeout: 60_000 });
    expect(out.toString().trim()).toBe(RESTORED_DB);

    restored = postgres(urlForDb(SOURCE_URL, RESTORED_DB), { max: 1, onnotice: () => {} });
    const after = await fingerprint(restored);
    expect([...after.keys()]).toEqual([...before.keys()]);
    for (const [table, fp] of before) expect(after.get(table), table).toEqual(fp);
    // The append-only audit trigger and every index and constraint come back too.
    expect(await schemaObjects(restored)).toEqual(beforeObjects);
  });

  it("the fingerprint notices a single changed row (so the comparison above can fail)", async () => {
    expect(restored).not.toBeNull();
    const before = await fingerprint(restored!);
    await restored!`update patients set given_name = given_name || 'x' where id = (select id from patients order by id limit 1)`;
    const after = await fingerprint(restored!);
    expect(after.get("public.patients")!.rows).toBe(before.get("public.patients")!.rows);
    expect(after.get("public.patients")!.md5).not.toBe(before.get("public.patients")!.md5);
  });

  it("refuses to restore over an existing database", () => {
    const env = { ...process.env, DATABASE_URL: SOURCE_URL };
    expect(() => execFileSync("bash", [path.join(ROOT, "scripts/restore.sh"), dumpFile, RESTORED_DB], { env, stdio: "pipe" })).toThrow();
  });
});
