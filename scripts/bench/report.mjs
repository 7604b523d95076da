// Gathers the bench steps' JSON into bench/results.json and prints one table: each figure beside
// its floor from the same run, the ratio, the target and whether it is met. A step that could not
// run prints "not measured: <reason>" instead of a number.
// Run: node scripts/bench/report.mjs <parts-dir> <results.json> <elapsed-seconds>
import { existsSync, readFileSync, writeFileSync } from "node:fs";
import path from "node:path";

const [dir, outFile, elapsed] = process.argv.slice(2);
const load = (name) => {
  const f = path.join(dir, `${name}.json`);
  if (existsSync(f)) {
    try {
      return { data: JSON.parse(readFileSync(f, "utf8")) };
    } catch (e) {
      return { why: `unreadable output (${e.message})` };
    }
  }
  const err = path.join(dir, `${name}.err`);
  return { why: existsSync(err) ? readFileSync(err, "utf8").trim().replace(/\s+/g, " ").slice(0, 160) : "did not run" };
};

const rows = [];
// Conditions that fail the whole run (exit code 1), printed after the table.
const failures = [];
const row = (what, figure, floor, ratio, target, ok) => rows.push({ what, figure, floor, ratio, target, ok: ok === undefined ? "" : ok ? "yes" : "NO" });
const missing = (what, why) => rows.push({ what, figure: `not measured: ${why}`, floor: "", ratio: "", target: "", ok: "" });
const ms = (x) => (x === null || x === undefined ? "?" : `${x} ms`);
const r2 = (a, b) => +(a / b).toFixed(2);

const api = load("api");
if (api.data) {
  const { floor: f, mix: m, sessionFloor: s, connections } = api.data;
  // A pass where far fewer than all connections were busy (throughput × mean latency) had requests
  // left unanswered: its latencies describe only the rest, so it is flagged instead of shown.
  const suspect = (name, pass) => {
    if (pass?.busyConnections === undefined || pass.busyConnections >= 0.9 * connections) return false;
    missing(`API ${name} pass`, `only ${pass.busyConnections} of ${connections} connections had a request answered on average: its figures are suspect`);
    return true;
  };
  const floorSuspect = suspect("floor", f);
  if (!suspect("mix", m) && !floorSuspect) {
    row("API mix, 50 conn: throughput", `${m.reqPerSec} req/s`, `${f.reqPerSec} req/s`, api.data.throughputRatio, "≥ 0.5", api.data.throughputRatio >= 0.5);
    row("API mix: p50 latency", ms(m.p50Ms), ms(f.p50Ms), r2(m.p50Ms, f.p50Ms), "", undefined);
    row("API mix: p95 latency", ms(m.p95Ms), ms(f.p95Ms), api.data.p95Ratio, "≤ 2", api.data.p95Ratio <= 2);
    row("API mix: p99 latency", ms(m.p99Ms), ms(f.p99Ms), r2(m.p99Ms, f.p99Ms), "", undefined);
  }
  row("API mix: errors (409s apart)", `${m.errors} of ${m.requests} (409: ${m.conflicts409})`, `${f.errors} of ${f.requests}`, "", "0", m.errors === 0);
  // For context: a signed-in request that does nothing but the session check, against the same floor.
  if (s && !suspect("session check", s) && !floorSuspect) {
    row("Session check only (GET /api/me/preferences): throughput", `${s.reqPerSec} req/s`, `${f.reqPerSec} req/s`, s.throughputRatio, "(reported)", undefined);
    row("Session check only: p95 latency", ms(s.p95Ms), ms(f.p95Ms), s.p95Ratio, "(reported)", undefined);
    row("API mix against the session-check route: throughput / p95", "", "", `${r2(m.reqPerSec, s.reqPerSec)} / ${r2(m.p95Ms, s.p95Ms)}`, "(reported)", undefined);
  }
  // The write floor: session check + JSON body + zod + BEGIN; SELECT 1; COMMIT. The mix's targets.
  const wf = api.data.writeFloor;
  if (wf && !suspect("write floor", wf)) {
    const t = api.data.againstWriteFloor;
    row("Write floor (POST /api/bench/write-floor): throughput / p95", `${wf.reqPerSec} req/s / ${ms(wf.p95Ms)}`, `${f.reqPerSec} req/s / ${ms(f.p95Ms)}`, `${wf.throughputRatio} / ${wf.p95Ratio}`, "(reported)", undefined);
    if (!suspect("mix", m)) {
      row("API mix against the write floor: throughput", `${m.reqPerSec} req/s`, `${wf.reqPerSec} req/s`, t.throughputRatio, "≥ 0.8", t.throughputRatio >= 0.8);
      row("API mix against the write floor: p95 latency", ms(m.p95Ms), ms(wf.p95Ms), t.p95Ratio, "≤ 1.5", t.p95Ratio <= 1.5);
    }
    row("Write floor: errors", `${wf.errors} of ${wf.requests}`, "", "", "0", wf.errors === 0);
  }
  // Server CPU per answered request (/proc: the server process, PostgreSQL's processes).
  for (const [name, c] of Object.entries(api.data.cpu ?? {})) {
    if (!c || c.totalMs === null) missing(`Server CPU per request: lesion ${name}`, "no CPU reading (SERVER_PID / PG_POSTMASTER_PID unset, or nothing answered)");
    else row(`Server CPU per request: lesion ${name} (server + PostgreSQL)`, `${c.totalMs} ms (server ${c.serverMs}, PostgreSQL ${c.postgresMs})`, "", "", "≤ 3.0 ms, PostgreSQL ≤ 1.5 ms", c.totalMs <= 3 && c.postgresMs <= 1.5);
  }
  const fc = api.data.floorCpu;
  if (fc && fc.totalMs !== null) row("Server CPU per request: write floor (server + PostgreSQL)", `${fc.totalMs} ms (server ${fc.serverMs}, PostgreSQL ${fc.postgresMs})`, "", "", "(reported)", undefined);
  for (const [name, c] of Object.entries(api.data.mixStepCpu ?? {})) {
    if (c && c.totalMs !== null) row(`Mix step alone: ${name}: CPU per request (server + PostgreSQL), throughput`, `${c.totalMs} ms (server ${c.serverMs}, PostgreSQL ${c.postgresMs}), ${c.reqPerSec} req/s`, "", "", "(reported)", undefined);
  }
  for (const p of ["createOnly", "updateOnly"]) if (api.data[p]) row(`Lesion ${p === "createOnly" ? "creates" : "updates"} alone: errors`, `${api.data[p].errors} of ${api.data[p].requests}`, "", "", "0", api.data[p].errors === 0);
  // Every load pass: ≥ 90% of the connections busy and no timeout, or the run fails (exit 1).
  const health = api.data.health ?? ["no health record from api-load.mjs"];
  row("API load passes: all connections busy, no timeouts", health.length ? health.join("; ") : "every pass", "", "", `≥ ${Math.ceil(0.9 * connections)} of ${connections} busy, 0 timeouts`, health.length === 0);
  if (health.length) failures.push(`API load passes: ${health.join("; ")}`);
} else {
  missing("API under load", api.why);
  failures.push(`API under load did not run: ${api.why}`);
}

const map = load("map");
if (map.data) {
  const { tap, rerender } = map.data;
  row("Map 200 lesions: tap-to-painted (median)", ms(tap.appMedianMs), ms(tap.floorMedianMs), tap.ratio, "≤ 2, < 16 ms", tap.ratio <= 2 && tap.appMedianMs < 16);
  if (map.data.tapToInspector) row("Map 200 lesions: tap until the inspector form is painted (median)", ms(map.data.tapToInspector.appMedianMs), "", "", "(reported)");
  row("Map 200 lesions: full re-render (median)", ms(rerender.appMedianMs), ms(rerender.floorMedianMs), rerender.ratio, "≤ 2, < 16 ms", rerender.ratio <= 2 && rerender.appMedianMs < 16);
  if (!map.data.selectionWorked) missing("Map: tap selected a lesion", "the tap did not select (figure above is suspect)");
} else missing("Canal map in Chromium", map.why);

const seq = load("sequential");
if (seq.data) {
  const { floor: f, create: c, move: mv, timeline: t } = seq.data;
  row("Lesion create round trip p50 / p95", `${c.p50Ms} / ${c.p95Ms} ms`, `${f.p50Ms} / ${f.p95Ms} ms`, r2(c.p50Ms, f.p50Ms), "", undefined);
  row("Lesion extent edit round trip p50 / p95", `${mv.p50Ms} / ${mv.p95Ms} ms`, `${f.p50Ms} / ${f.p95Ms} ms`, r2(mv.p50Ms, f.p50Ms), "", undefined);
  row("Timeline 30×40 GET p50 / p95", `${t.p50Ms} / ${t.p95Ms} ms`, `${f.p50Ms} / ${f.p95Ms} ms`, `p95 ${r2(t.p95Ms, f.p95Ms)}`, "p95 ≤ 4× floor", r2(t.p95Ms, f.p95Ms) <= 4);
  if (t.bodyBytes !== undefined) row("Timeline 30×40: answer size (JSON / gzip)", `${(t.bodyBytes / 1024).toFixed(1)} KB / ${(t.gzipBytes / 1024).toFixed(1)} KB`, "", "", "< 150 KB JSON", t.bodyBytes < 150 * 1024);
  const bad = Object.keys(c.statuses).some((s) => s !== "201") || [mv, t].some((x) => Object.keys(x.statuses).some((s) => s !== "200"));
  if (bad) missing("Sequential statuses", `unexpected statuses create ${JSON.stringify(c.statuses)} extent edit ${JSON.stringify(mv.statuses)} timeline ${JSON.stringify(t.statuses)}`);
} else missing("Round trips (create, timeline)", seq.why);

const tq = load("timeline-queries");
if (tq.data) row("Timeline 30×40: SQL statements", `${tq.data.queries} for ${tq.data.visits} visits, ${tq.data.lesions} lesions`, "", "", "fixed, not per row", tq.data.visits === 30 && tq.data.lesions === 1200 && tq.data.queries <= 12);
else missing("Timeline query count", tq.why);

const ex = load("export");
if (ex.data) {
  const e = ex.data;
  const hwmFile = path.join(dir, "export-hwm.txt");
  const hwmMb = existsSync(hwmFile) && readFileSync(hwmFile, "utf8").trim() ? Math.round(Number(readFileSync(hwmFile, "utf8")) / 102.4) / 10 : null;
  e.serverVmHwmMb = hwmMb;
  row(`Export CSV ${e.rows.toLocaleString("en")} lesion rows`, ms(e.appCsvMs), `${ms(e.rawCopyMs)} (psql \\copy)`, e.ratio, "≤ 1.5", e.ratio <= 1.5 && e.sameBytes);
  // The CSV peak is sampled every 20 ms while it streams; VmHWM (peak since the server started,
  // read after the workbook too) is reported beside it in results.json.
  row("Export CSV: server peak RSS (sampled)", `${e.serverPeakRssMbCsv} MB`, `${e.serverIdleRssMb} MB idle server`, r2(e.serverPeakRssMbCsv, e.serverIdleRssMb), "< 150 MB", e.serverPeakRssMbCsv < 150);
  row("Export workbook (all rows): time / peak RSS", e.workbookStatus === 200 ? `${ms(e.workbookMs)} / ${e.serverPeakRssMbWorkbook} MB` : `status ${e.workbookStatus}`, `VmHWM ${hwmMb ?? "?"} MB`, "", "report", undefined);
} else missing("Export 200,000 rows", ex.why);

// Research reads (scripts/bench/research-bench.ts): p95 on the primary and on the replica.
for (const [name, dashTarget, qualityTarget] of [["research-10k", 150, null], ["research-100k", 1000, 500]]) {
  const r = load(name);
  if (!r.data) {
    missing(`Study dashboard / quality panel (${name.slice(9)})`, r.why);
    continue;
  }
  const d = r.data;
  const size = `${d.patients.toLocaleString("en")} patients, ${d.lesions.toLocaleString("en")} lesions`;
  for (const [mode, m] of [["primary", d.primary], ["replica", d.replica]]) {
    if (!m) {
      missing(`Study dashboard ${d.label} (${mode})`, "no replica");
      continue;
    }
    row(`Study dashboard ${d.label} (${size}), ${mode}: p50 / p95`, `${m.dashboard.p50Ms} / ${m.dashboard.p95Ms} ms`, "", "", `p95 ≤ ${dashTarget} ms`, m.dashboard.p95Ms <= dashTarget);
    if (m.refresh) row(`Study dashboard ${d.label}, ${mode}: figures worked out again (the background refresh): p50`, ms(m.refresh.p50Ms), "", "", "(reported; figures are stored, shown with their time)", undefined);
    row(`Quality panel ${d.label} (year ${d.year}), ${mode}: p50 / p95`, `${m.quality.p50Ms} / ${m.quality.p95Ms} ms`, "", "", qualityTarget ? `p95 ≤ ${qualityTarget} ms` : "(reported)", qualityTarget ? m.quality.p95Ms <= qualityTarget : undefined);
    if (m.qualityRefresh) row(`Quality panel ${d.label}, ${mode}: figures worked out again (the background refresh): p50`, ms(m.qualityRefresh.p50Ms), "", "", "(reported; figures are stored, shown with their time)", undefined);
  }
}

const imp = load("patient-import");
if (imp.data) {
  const i = imp.data;
  const wrote = i.importResult?.created === i.rows && i.reimportResult?.unchanged === i.rows && i.patientsStored === i.rows;
  row(`Patient import ${i.rows.toLocaleString("en")} CSV rows: check + import`, ms(i.totalMs), "", "", "< 30 s", i.totalMs < 30_000 && wrote);
  row("Patient import: check / import / same file again", `${ms(i.checkMs)} / ${ms(i.importMs)} / ${ms(i.reimportMs)}`, "", "", "(reported)", undefined);
  if (!wrote) missing("Patient import: rows written", `expected ${i.rows} created then unchanged; got ${JSON.stringify(i.importResult)} then ${JSON.stringify(i.reimportResult)}`);
} else missing("Patient import 10,000 rows", imp.why);

const pages = load("pages");
if (pages.data) {
  const { firstLoadJs: js, lighthouse: lh } = pages.data;
  const mapRoute = "/patients/[patientId]/visits/[visitId]";
  const patientRoute = "/patients/[patientId]";
  if (js.routes[mapRoute] !== undefined) row("First-load JS, map page (gzip)", `${js.routes[mapRoute]} kB`, `${js.floorSharedKb} kB framework`, r2(js.routes[mapRoute], js.floorSharedKb), "< 250 kB", js.routes[mapRoute] < 250);
  if (js.routes[patientRoute] !== undefined) row("First-load JS, patient page (gzip)", `${js.routes[patientRoute]} kB`, `${js.floorSharedKb} kB framework`, r2(js.routes[patientRoute], js.floorSharedKb), "", undefined);
  for (const [name, s] of Object.entries(lh)) {
    row(`Lighthouse ${name} page: perf / a11y`, s.runtimeError ? `error: ${s.runtimeError}` : `${s.performance} / ${s.accessibility}`, "", "", "score out of 100", undefined);
  }
} else missing("Pages (first-load JS, Lighthouse)", pages.why);

const results = { when: new Date().toISOString(), elapsedSeconds: Number(elapsed), host: { cores: (await import("node:os")).cpus().length, node: process.version } };
for (const n of ["api", "map", "sequential", "timeline-queries", "export", "research-10k", "research-100k", "patient-import", "pages", "prepare"]) {
  const p = load(n);
  results[n] = n === "prepare" ? (p.data ? { slots: p.data.slots.length } : { notMeasured: p.why }) : p.data ?? { notMeasured: p.why };
}
results.table = rows;
writeFileSync(outFile, JSON.stringify(results, null, 2) + "\n");

const cols = ["what", "figure", "floor", "ratio", "target", "ok"];
const head = { what: "benchmark", figure: "figure", floor: "floor (same run)", ratio: "ratio (p50 unless named)", target: "target", ok: "met" };
const width = Object.fromEntries(cols.map((c) => [c, Math.max(...[head, ...rows].map((r) => String(r[c]).length))]));
const fmt = (r) => cols.map((c) => String(r[c]).padEnd(width[c])).join(" | ");
console.log("\n" + fmt(head));
console.log(cols.map((c) => "-".repeat(width[c])).join("-|-"));
for (const r of rows) console.log(fmt(r));
console.log(`\n${results.host.cores} cores, Node ${process.version}, ${elapsed} s in all. Written to ${outFile}.`);
if (failures.length) {
  console.error(`\nBENCH RUN FAILED:\n${failures.map((x) => `  - ${x}`).join("\n")}`);
  process.exit(1);
}
