// Sums vitest JSON reports into the closing line "N passed, N failed[, N skipped]".
// A step that failed without a report (typecheck, build) counts as one failure; a report that
// is missing counts as one failure too. Exit code 1 on any failure.
import { existsSync, readFileSync } from "node:fs";

const [extra, ...files] = process.argv.slice(2);
let passed = 0;
let failed = Number(extra) || 0;
let skipped = 0;
for (const f of files) {
  if (!existsSync(f)) {
    failed += 1;
    continue;
  }
  const r = JSON.parse(readFileSync(f, "utf8"));
  passed += r.numPassedTests ?? 0;
  failed += r.numFailedTests ?? 0;
  skipped += (r.numPendingTests ?? 0) + (r.numTodoTests ?? 0);
  // A file that failed outside its tests (failed to load, a failing beforeAll/afterAll) is a
  // failure even when every test in it passed.
  for (const suite of r.testResults ?? []) {
    const failedInside = (suite.assertionResults ?? []).some((a) => a.status === "failed");
    if (suite.status === "failed" && !failedInside) failed += 1;
  }
}
console.log(`${passed} passed, ${failed} failed${skipped ? `, ${skipped} skipped` : ""}`);
process.exit(failed > 0 || passed === 0 ? 1 : 0);
