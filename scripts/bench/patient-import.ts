// Import bench: a CSV file of the largest size accepted (10,000 invented patients) through the
// running app, as the import page sends it: the check (preview and dry run), the import (one
// transaction, progress streamed), then the same file again (every row unchanged). Into a site
// and by a clinician of their own, made here, so no other bench figure sees these patients. Prints one JSON line. Target: check + import under 30 s.
//
// DATABASE_URL=… DENTATE_BASE_URL=http://127.0.0.1:3300
//   node_modules/.bin/tsx --conditions=react-server scripts/bench/patient-import.ts
import { randomUUID } from "node:crypto";
import postgres from "postgres";
import { runScript } from "@/db/client";
import { MAX_ROWS } from "@/lib/patient-import/limits";

const url = process.env.DATABASE_URL;
const base = process.env.DENTATE_BASE_URL ?? "http://127.0.0.1:3000";
if (!url) throw new Error("DATABASE_URL is not set");
const sql = postgres(url, { max: 1, onnotice: () => {} });

// Invented names, combined deterministically.
const FAMILY = ["Abara", "Brandt", "Castellan", "Dunmore", "Eskildsen", "Farrow", "Gallo", "Hoshino", "Iversen", "Jarrah", "Kowal", "Lindqvist"];
const GIVEN = ["Ari", "Bo", "Cleo", "Dev", "Edda", "Finn", "Gus", "Hana", "Ivo", "Juno", "Kai", "Lio"];
const RISKS = ["", "msm_tw_hiv", "other_hiv;solid_organ_transplant", "perianal_warts", "other"];

function file(rows: number): string {
  const lines = ["MRN,Family name,Given name,Date of birth,Sex at birth,HIV status,Risk groups,Postal code,Email"];
  for (let i = 0; i < rows; i++) {
    const born = `${1940 + (i % 60)}-${String(1 + (i % 12)).padStart(2, "0")}-${String(1 + (i % 28)).padStart(2, "0")}`;
    lines.push([`B-${String(i).padStart(6, "0")}`, FAMILY[i % 12], GIVEN[(i * 7) % 12], born, i % 2 ? "F" : "M", ["positive", "negative", "unknown"][i % 3], RISKS[i % 5], String(10000 + (i % 89999)), i % 4 ? "" : `p${i}@example.test`].join(","));
  }
  return lines.join("\n") + "\n";
}

async function post(path: string, cookie: string, body: unknown): Promise<{ ms: number; status: number; text: string }> {
  const t0 = performance.now();
  const res = await fetch(`${base}${path}`, { method: "POST", headers: { cookie, origin: base, "content-type": "application/json" }, body: JSON.stringify(body) });
  const text = await res.text();
  return { ms: Math.round(performance.now() - t0), status: res.status, text };
}

const lastEvent = (text: string) => JSON.parse(text.trim().split("\n").at(-1)!) as { stage: string; result?: Record<string, number> };

async function main() {
  const [site] = await sql<{ id: string }[]>`insert into sites (code, name) values (${`BENCH-${randomUUID().slice(0, 8)}`}, 'Import bench clinic') returning id`;
  const userId = `u-bench-import-${randomUUID()}`;
  await sql`insert into users (id, email, display_name, role) values (${userId}, ${`${userId}@bench.example`}, 'Import bench clinician', 'clinician')`;
  await sql`insert into user_sites (user_id, site_id) values (${userId}, ${site!.id})`;
  const { createSession } = await import("@/lib/auth/session");
  const { SESSION_COOKIE } = await import("@/lib/auth/lucia");
  const cookie = `${SESSION_COOKIE}=${await createSession(userId)}`;
  const content = file(MAX_ROWS);
  const body = { siteId: site!.id, format: "csv", fileName: "bench.csv", content };

  const check = await post("/api/patients/import/check", cookie, body);
  const report = JSON.parse(check.text) as { problems?: unknown[]; plan?: Record<string, number> };
  const first = await post("/api/patients/import", cookie, body);
  const again = await post("/api/patients/import", cookie, body);
  const [{ n }] = await sql<{ n: number }[]>`select count(*)::int as n from patients where site_id = ${site!.id}`;
  console.log(JSON.stringify({
    rows: MAX_ROWS,
    fileBytes: Buffer.byteLength(content),
    checkMs: check.ms,
    checkStatus: check.status,
    checkProblems: report.problems?.length ?? null,
    importMs: first.ms,
    importStatus: first.status,
    importResult: lastEvent(first.text).result ?? lastEvent(first.text),
    reimportMs: again.ms,
    reimportResult: lastEvent(again.text).result ?? lastEvent(again.text),
    patientsStored: n,
    totalMs: check.ms + first.ms,
    targetMs: 30_000,
  }));
}

runScript(main, sql);
