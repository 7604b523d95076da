// Export bench: the lesions CSV of a whole study through the running app vs a raw psql \copy of
// the very same SELECT, in the same run, plus the server's peak resident memory while it streams.
// Prints one JSON line. Targets (issue 6): time ratio ≤ 1.5, server peak RSS < 150 MB.
//
// DATABASE_URL=… DENTATE_BASE_URL=http://127.0.0.1:3204 [DENTATE_COOKIE=dentate_session=…]
//   [SERVER_PID=…] [BENCH_STUDY=SCL-REG-01] [BENCH_USER=u-admin-whitley]
//   node_modules/.bin/tsx --conditions=react-server scripts/bench/export-bench.ts
// Without DENTATE_COOKIE it opens a session for BENCH_USER itself; without SERVER_PID it finds
// the process listening on the base URL's port.
import { execFileSync, spawn } from "node:child_process";
import { readFileSync } from "node:fs";
import postgres from "postgres";
import { lesionsSelect } from "@/db/queries/research/export-sql";
import { exportFilterSchema } from "@/lib/validation/research";
import { runScript } from "@/db/client";

const url = process.env.DATABASE_URL;
const base = process.env.DENTATE_BASE_URL ?? "http://127.0.0.1:3000";
const psqlBin = process.env.PSQL ?? "/usr/lib/postgresql/15/bin/psql";
const studyCode = process.env.BENCH_STUDY ?? "SCL-REG-01";
const rounds = Number(process.env.BENCH_ROUNDS ?? 2);
if (!url) throw new Error("DATABASE_URL is not set");
const sql = postgres(url, { max: 1, onnotice: () => {} });

function serverPid(): number {
  if (process.env.SERVER_PID) return Number(process.env.SERVER_PID);
  const port = new URL(base).port || "80";
  const out = execFileSync("ss", ["-ltnpH", `sport = :${port}`], { encoding: "utf8" });
  const m = /pid=(\d+)/.exec(out);
  if (!m) throw new Error(`No process found listening on port ${port}; set SERVER_PID`);
  return Number(m[1]);
}

function rssKb(pid: number): number {
  const m = /VmRSS:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, "utf8"));
  return m ? Number(m[1]) : 0;
}

async function cookie(): Promise<string> {
  if (process.env.DENTATE_COOKIE) return process.env.DENTATE_COOKIE;
  const { createSession } = await import("@/lib/auth/session");
  const { SESSION_COOKIE } = await import("@/lib/auth/lucia");
  return `${SESSION_COOKIE}=${await createSession(process.env.BENCH_USER ?? "u-admin-whitley")}`;
}

/** Runs psql \copy of the SELECT to stdout and counts the bytes, as the HTTP client does. */
function rawCopy(select: string): Promise<{ ms: number; bytes: number }> {
  const flat = select.replace(/\s+/g, " ");
  return new Promise((resolve, reject) => {
    const t0 = performance.now();
    const child = spawn(psqlBin, [url!, "-X", "-q", "-v", "ON_ERROR_STOP=1", "-c", `\\copy (${flat}) to stdout with (format csv, header)`]);
    let bytes = 0;
    child.stdout.on("data", (b: Buffer) => (bytes += b.length));
    child.stderr.on("data", (b: Buffer) => process.stderr.write(b));
    child.on("error", reject);
    child.on("close", (code) => (code === 0 ? resolve({ ms: performance.now() - t0, bytes }) : reject(new Error(`psql exited ${code}`))));
  });
}

/** Downloads through the app while sampling the server's RSS every 20 ms. */
async function viaApp(path: string, auth: string, pid: number): Promise<{ ms: number; bytes: number; peakRssMb: number; status: number }> {
  let peak = rssKb(pid);
  const timer = setInterval(() => (peak = Math.max(peak, rssKb(pid))), 20);
  const t0 = performance.now();
  const res = await fetch(`${base}${path}`, { headers: { cookie: auth } });
  let bytes = 0;
  for await (const chunk of res.body as unknown as AsyncIterable<Uint8Array>) bytes += chunk.length;
  const ms = performance.now() - t0;
  clearInterval(timer);
  peak = Math.max(peak, rssKb(pid));
  return { ms, bytes, peakRssMb: Math.round(peak / 102.4) / 10, status: res.status };
}

async function main() {
  const [study] = await sql<{ id: string }[]>`SELECT id FROM studies WHERE code = ${studyCode}`;
  if (!study) throw new Error(`Study ${studyCode} not found: run scripts/seed-scale.ts first`);
  const siteIds = (await sql<{ site_id: string }[]>`SELECT site_id FROM study_sites WHERE study_id = ${study.id}`).map((r) => r.site_id);
  const select = lesionsSelect({ filter: exportFilterSchema.parse({ studyId: study.id }), siteIds });
  const [{ n }] = await sql<{ n: number }[]>`SELECT count(*)::int AS n FROM (${sql.unsafe(select)}) x`;
  const auth = await cookie();
  const pid = serverPid();
  const idleRssMb = Math.round(rssKb(pid) / 102.4) / 10;

  const raw: number[] = [], app: number[] = [];
  let appRun = { bytes: 0, peakRssMb: 0, status: 0 }, rawBytes = 0;
  for (let i = 0; i < rounds; i++) {
    const r = await rawCopy(select);
    raw.push(r.ms);
    rawBytes = r.bytes;
    const a = await viaApp(`/api/exports/lesions?studyId=${study.id}`, auth, pid);
    app.push(a.ms);
    appRun = { bytes: a.bytes, peakRssMb: Math.max(appRun.peakRssMb, a.peakRssMb), status: a.status };
  }
  const wb = await viaApp(`/api/exports/workbook?studyId=${study.id}`, auth, pid);
  const best = (xs: number[]) => Math.round(Math.min(...xs));
  console.log(JSON.stringify({
    study: studyCode,
    rows: n,
    rawCopyMs: best(raw),
    appCsvMs: best(app),
    ratio: Math.round((Math.min(...app) / Math.min(...raw)) * 100) / 100,
    ratioTarget: 1.5,
    sameBytes: appRun.bytes === rawBytes,
    csvBytes: appRun.bytes,
    status: appRun.status,
    serverIdleRssMb: idleRssMb,
    serverPeakRssMbCsv: appRun.peakRssMb,
    serverPeakRssMbWorkbook: wb.peakRssMb,
    rssTargetMb: 150,
    workbookMs: Math.round(wb.ms),
    workbookBytes: wb.bytes,
    workbookStatus: wb.status,
  }));
}

runScript(main, sql);
