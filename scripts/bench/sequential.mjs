// Sequential round trips on loopback, one request at a time (no queueing in the figures):
// 50 lesion creates on the map visit's sibling slot, 50 extent edits of one lesion there (moved as
// a drag on the map would: no change of grade or track), 50 timeline GETs of the 30 × 40 patient,
// and 50 GETs of the constant-JSON floor for the same client and connection handling.
// Run: node scripts/bench/sequential.mjs <base-url> <prepare.json>
import { readFileSync } from "node:fs";
import { gzipSync } from "node:zlib";

const [base, prepFile] = process.argv.slice(2);
const prep = JSON.parse(readFileSync(prepFile, "utf8"));
const N = 50;
const headers = { cookie: prep.cookie, origin: base, "content-type": "application/json" };

async function timed(n, fn) {
  const ms = [];
  const statuses = {};
  await fn(-1); // warm-up: first compile of the route and a pool connection
  for (let i = 0; i < n; i++) {
    const t0 = performance.now();
    const status = await fn(i);
    ms.push(performance.now() - t0);
    statuses[status] = (statuses[status] ?? 0) + 1;
  }
  const s = ms.sort((a, b) => a - b);
  const at = (p) => +s[Math.min(s.length - 1, Math.ceil((p / 100) * s.length) - 1)].toFixed(1);
  return { n, p50Ms: at(50), p95Ms: at(95), statuses };
}

async function call(path, init, onBody) {
  const res = await fetch(`${base}${path}`, { headers, ...init });
  const text = await res.text();
  onBody?.(res.status, text);
  return res.status;
}

// Creates go to the last load slot's visit, which the load test has finished with.
const slot = prep.slots[prep.slots.length - 1];
const floor = await timed(N, () => call("/api/ping"));
const create = await timed(N, (i) =>
  call(`/api/visits/${slot.visitId}/lesions`, {
    method: "POST",
    body: JSON.stringify({ clockStartH: ((i + 1) * 0.9) % 12, clockEndH: ((i + 1) * 0.9 + 0.5) % 12, distanceStartCm: 0.5, distanceEndCm: 1.5, grade: "hsil", vessels: [] }),
  }),
);
// The slot's own lesion, at the version the load test left it at; each answer gives the next.
const map = await (await fetch(`${base}/api/visits/${slot.visitId}/lesions`, { headers })).json();
let version = map.lesions.find((l) => l.id === slot.lesionId).version;
const move = await timed(N, (i) =>
  call(
    `/api/visits/${slot.visitId}/lesions/${slot.lesionId}`,
    { method: "PATCH", body: JSON.stringify({ version, clockStartH: (i + 2) % 12, clockEndH: (i + 3) % 12 }) },
    (status, text) => {
      if (status === 200) version = JSON.parse(text).lesion.version;
    },
  ),
);
// The answer's size as JSON (what the tablet parses) and gzipped (about what crosses the network).
let bodyBytes = 0;
const timeline = await timed(N, () => call(`/api/patients/${prep.timeline.patientId}/timeline`, undefined, (_status, text) => (bodyBytes = Buffer.byteLength(text))));
const lastBody = await (await fetch(`${base}/api/patients/${prep.timeline.patientId}/timeline`, { headers })).text();
timeline.bodyBytes = bodyBytes;
timeline.gzipBytes = gzipSync(lastBody).length;
console.log(JSON.stringify({ floor, create, move, timeline }));
