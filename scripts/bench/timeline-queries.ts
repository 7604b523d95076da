// SQL statements the timeline costs for the 30 visits × 40 lesions patient: loadTimeline called
// directly, with the audit of the read the route writes, every statement counted through
// db/client's onQuery. postgres.js's pg_catalog type lookups are left out (once per new pool
// connection, not per request).
// Run: DATABASE_URL=… tsx --conditions=react-server scripts/bench/timeline-queries.ts <prepare.json>
import { readFileSync } from "node:fs";
import { onQuery, runScript } from "@/db/client";
import { loadTimeline } from "@/lib/server/timeline";

async function main() {
  const prep = JSON.parse(readFileSync(process.argv[2]!, "utf8"));
  const scope = { userId: "u-clin-okafor", siteIds: [prep.siteId as string] };
  const audit = { userId: scope.userId, action: "patient.timeline.read", ip: "127.0.0.1" };
  await loadTimeline(scope, prep.timeline.patientId, audit); // warm the pool
  let queries = 0;
  const stop = onQuery((q) => {
    if (!q.includes("pg_catalog")) queries++;
  });
  const data = await loadTimeline(scope, prep.timeline.patientId, audit);
  stop();
  console.log(JSON.stringify({ queries, visits: data.visits.length, lesions: data.lesions.length }));
}

runScript(main);
