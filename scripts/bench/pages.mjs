// Pages: first-load JavaScript per route and Lighthouse scores.
// First-load JS: Next 16 no longer prints sizes in the build output; it writes, per route, the
// chunks a first visit loads to <distDir>/diagnostics/route-bundle-stats.json. Each chunk is
// gzipped here (zlib default level, as a server would send it) and summed per route. The floor is
// the framework's own shared chunks (build-manifest rootMainFiles) that every page loads whatever
// it does (the polyfill chunk is left out: modern browsers skip it, nomodule).
// Lighthouse 12.2.3 (the last line supporting Node 20) with its desktop preset, against Debian's
// chromium, signed in through the session cookie in extraHeaders.
// Run: node scripts/bench/pages.mjs <base-url> <prepare.json> <distDir>
import { readFileSync } from "node:fs";
import path from "node:path";
import { gzipSync } from "node:zlib";

const [base, prepFile, distDir] = process.argv.slice(2);
const prep = JSON.parse(readFileSync(prepFile, "utf8"));
const root = process.cwd();

const gz = (rel) => gzipSync(readFileSync(path.join(root, rel))).length;
const kB = (b) => Math.round(b / 102.4) / 10;

function firstLoad() {
  const statsFile = path.join(distDir, "diagnostics/route-bundle-stats.json");
  const stats = JSON.parse(readFileSync(statsFile, "utf8"));
  const manifest = JSON.parse(readFileSync(path.join(distDir, "build-manifest.json"), "utf8"));
  const shared = manifest.rootMainFiles.map((f) => path.join(distDir, f));
  const routes = {};
  for (const r of stats) routes[r.route] = kB(r.firstLoadChunkPaths.reduce((sum, f) => sum + gz(f), 0));
  return { method: "sum of gzipped firstLoadChunkPaths from diagnostics/route-bundle-stats.json", floorSharedKb: kB(shared.reduce((s, f) => s + gz(f), 0)), routes };
}

async function lighthouseScores(urls) {
  const { default: lighthouse } = await import("lighthouse");
  const { default: desktop } = await import("lighthouse/core/config/desktop-config.js");
  const chromeLauncher = await import("chrome-launcher");
  const chrome = await chromeLauncher.launch({
    chromePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
    chromeFlags: ["--headless=new", "--no-sandbox", "--disable-gpu", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync"],
  });
  const out = {};
  try {
    for (const [name, url] of Object.entries(urls)) {
      const result = await lighthouse(url, { port: chrome.port, output: "json", logLevel: "error", onlyCategories: ["performance", "accessibility"], extraHeaders: { Cookie: prep.cookie } }, desktop);
      const lhr = result.lhr;
      out[name] = {
        url: lhr.finalDisplayedUrl,
        performance: Math.round((lhr.categories.performance.score ?? 0) * 100),
        accessibility: Math.round((lhr.categories.accessibility.score ?? 0) * 100),
        lcpMs: Math.round(lhr.audits["largest-contentful-paint"]?.numericValue ?? 0),
        tbtMs: Math.round(lhr.audits["total-blocking-time"]?.numericValue ?? 0),
        runtimeError: lhr.runtimeError?.message ?? null,
      };
    }
  } finally {
    await chrome.kill();
  }
  return out;
}

const js = firstLoad();
const lighthouse = await lighthouseScores({
  patient: `${base}/patients/${prep.map.patientId}`,
  map: `${base}/patients/${prep.map.patientId}/visits/${prep.map.visitId}`,
});
console.log(JSON.stringify({ firstLoadJs: js, lighthouse }));
