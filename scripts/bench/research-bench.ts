// Research reads at scale: the study dashboard (loadRegistryDashboard, and the refresh of its stored
// figures) and the clinic-quality
// panel (loadQualityPanel) for the scale registry (scripts/seed-scale.ts, study SCL-REG-01), timed
// in this process as the research pages call them, first on the primary, then (when
// BENCH_REPLICA_URL names a streaming replica of the same database) with DATABASE_REPLICA_URL set.
// Prints one JSON line: p50/p95 per figure and mode, and the registry's size.
// DATABASE_URL=… [BENCH_REPLICA_URL=…] [BENCH_ROUNDS=10] [BENCH_LABEL=10k]
//   node_modules/.bin/tsx --conditions=react-server scripts/bench/research-bench.ts
import postgres from "postgres";
import { runScript } from "@/db/client";
import { endReplica } from "@/db/replica";
import { loadQualityPanel, loadRegistryDashboard, refreshQualityFigures } from "@/lib/server/research";
import { refreshStudyFigures } from "@/lib/server/study-figures";

const url = process.env.DATABASE_URL;
if (!url) throw new Error("DATABASE_URL is not set");
const rounds = Number(process.env.BENCH_ROUNDS ?? 10);
const sql = postgres(url, { max: 1, onnotice: () => {} });

const pct = (xs: number[], p: number) => {
  const s = [...xs].sort((a, b) => a - b);
  return +s[Math.min(s.length - 1, Math.ceil((p / 100) * s.length) - 1)]!.toFixed(1);
};

async function time(fn: () => Promise<unknown>, runs = rounds): Promise<{ p50Ms: number; p95Ms: number; runs: number }> {
  await fn(); // warm: statement plans, the pool, the page cache
  const ms: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t0 = performance.now();
    await fn();
    ms.push(performance.now() - t0);
  }
  return { p50Ms: pct(ms, 50), p95Ms: pct(ms, 95), runs };
}

async function main() {
  const [study] = await sql<{ id: string; site_id: string }[]>`
    SELECT st.id, ss.site_id FROM studies st JOIN study_sites ss ON ss.study_id = st.id WHERE st.code = 'SCL-REG-01' LIMIT 1`;
  if (!study) throw new Error("study SCL-REG-01 is missing: load scripts/seed-scale.ts first");
  const [size] = await sql<{ patients: number; visits: number; lesions: number; year: number }[]>`
    SELECT (SELECT count(*)::int FROM enrolments WHERE study_id = ${study.id}) AS patients,
      (SELECT count(*)::int FROM visits WHERE site_id = ${study.site_id}) AS visits,
      (SELECT count(*)::int FROM lesions WHERE site_id = ${study.site_id}) AS lesions,
      (SELECT extract(year FROM visit_date)::int FROM visits WHERE site_id = ${study.site_id} AND status = 'signed' GROUP BY 1 ORDER BY count(*) DESC LIMIT 1) AS year`;
  const scope = { userId: "bench", siteIds: [study.site_id] };
  // The dashboard serves stored figures (lib/server/study-figures.ts): `refresh` is working them out
  // again with the exports' statements (what a load over their age starts in the background), and
  // `dashboard` is a page's load, refreshed just before so no background refresh runs meanwhile.
  const run = async () => ({
    refresh: await time(() => refreshStudyFigures(study.id, scope.siteIds), Math.min(rounds, 3)),
    dashboard: await time(() => loadRegistryDashboard(study.id, scope.siteIds)),
    qualityRefresh: await time(() => refreshQualityFigures(scope.siteIds, size!.year), Math.min(rounds, 3)),
    quality: await time(() => loadQualityPanel(scope, size!.year)),
  });
  delete process.env.DATABASE_REPLICA_URL;
  const primary = await run();
  let replica = null;
  if (process.env.BENCH_REPLICA_URL) {
    process.env.DATABASE_REPLICA_URL = process.env.BENCH_REPLICA_URL;
    replica = await run();
    await endReplica();
  }
  await sql.end();
  console.log(JSON.stringify({ label: process.env.BENCH_LABEL ?? "", ...size, primary, replica }));
}

runScript(main);
