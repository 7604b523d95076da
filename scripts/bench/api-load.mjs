// API under load: autocannon against `next start` on loopback, 50 connections. First the floor
// (GET /api/ping, constant JSON), then the clinician's working mix, in the same run:
// open a patient timeline, list a visit's lesions, create a lesion, update it, save the visit.
// Between them, for context, the authenticated floor: GET /api/me/preferences, which does nothing
// but the session check every signed-in request makes (one database round trip) and answers the
// user's display setting from it. No route of the mix can be cheaper than that. And the write
// floor: POST /api/bench/write-floor, the session check, a lesion-sized JSON body through zod and
// BEGIN; SELECT 1; COMMIT: what every write pays before its own work; the mix's targets are set
// against it. Last, lesion creates alone and updates alone, with the CPU the server process and
// PostgreSQL used per answered request (/proc, SERVER_PID and PG_POSTMASTER_PID from bench.sh).
// Every pass must keep (nearly) all connections busy and see no timeout: `health` lists the
// passes that did not, and the report then fails the run.
// Every request in flight works on its own draft visit (prepared by prepare.ts), so the versions
// it sends are the latest and a 409 would mean a real lost-update bug, not contention we staged;
// 409s are still counted apart from other errors.
// Run: node scripts/bench/api-load.mjs <base-url> <prepare.json> [seconds] [connections]
import { readFileSync } from "node:fs";
import { randomUUID } from "node:crypto";
import autocannon from "autocannon";
import { cpuNow, cpuPerRequest } from "./proc-cpu.mjs";

const [base, prepFile, secs = "10", conns = "50"] = process.argv.slice(2);
const prep = JSON.parse(readFileSync(prepFile, "utf8"));
const duration = Number(secs);
const connections = Number(conns);
const headers = { cookie: prep.cookie, origin: base, "content-type": "application/json" };

/**
 * Runs one autocannon pass; keeps every response time, since its summary has no p95. Beside it, a
 * probe on a connection of its own asks for the session-check route every 250 ms: if autocannon
 * reports requests unanswered while the probe is answered promptly, the load tool is at fault; if
 * the probe waits too, the server is (`probe` in each pass's figures).
 */
function run({ noProbe = false, ...opts }) {
  return new Promise((resolve, reject) => {
    const times = [];
    const probe = { sent: 0, maxMs: 0, unanswered: 0 };
    let probing = !noProbe;
    const probeLoop = (async () => {
      while (probing) {
        const t0 = performance.now();
        probe.sent++;
        try {
          const res = await fetch(`${base}/api/me/preferences`, { headers: { cookie: prep.cookie }, signal: AbortSignal.timeout(5000) });
          await res.arrayBuffer();
          probe.maxMs = Math.max(probe.maxMs, Math.round(performance.now() - t0));
        } catch {
          probe.unanswered++;
        }
        await new Promise((r) => setTimeout(r, 250));
      }
    })();
    const inst = autocannon({ url: base, connections, duration, timeout: 5, ...opts }, (err, res) => {
      probing = false;
      probeLoop.then(() => (err ? reject(err) : resolve({ ...res, times, probe })));
    });
    inst.on("response", (_client, _status, _bytes, ms) => times.push(ms));
    inst.on("error", reject);
  });
}

function pct(sorted, p) {
  if (!sorted.length) return null;
  return +sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)].toFixed(1);
}

/** One pass's figures; `conflicts409` (the mix) are counted apart from its errors. */
function summary(res, extra = {}) {
  const sorted = res.times.sort((a, b) => a - b);
  const non2xx = res.non2xx ?? 0;
  const meanMs = sorted.reduce((a, b) => a + b, 0) / (sorted.length || 1);
  return {
    requests: res.requests.total,
    reqPerSec: Math.round(res.requests.average),
    // Requests in flight on average (throughput × mean latency, Little's law): about `connections`
    // when every connection kept a request going; far fewer means some sat on an unanswered
    // request, and the latencies describe only the rest.
    busyConnections: Math.round((res.requests.average * meanMs) / 1000),
    p50Ms: pct(sorted, 50),
    p95Ms: pct(sorted, 95),
    p99Ms: pct(sorted, 99),
    non2xx,
    socketErrors: res.errors,
    timeouts: res.timeouts,
    errors: non2xx - (extra.conflicts409 ?? 0) + res.errors + res.timeouts,
    probe: res.probe,
    ...extra,
  };
}

/** A pass against the floor: throughput and p95 ratios. */
const against = (pass, floor) => ({ throughputRatio: +(pass.reqPerSec / floor.reqPerSec).toFixed(2), p95Ratio: +(pass.p95Ms / floor.p95Ms).toFixed(2) });

const statusCounts = {};
let conflicts = 0;
const note = (status, what) => {
  const key = `${what} ${status}`;
  statusCounts[key] = (statusCounts[key] ?? 0) + 1;
  if (status === 409) conflicts++;
};

// A fresh lesion near where the previous one was drawn; the extent moves so no two are identical.
// With a new client key each, as the map editor sends (the server first looks for that key).
const lesionBody = (n) => ({ clockStartH: (n * 0.7) % 12, clockEndH: (n * 0.7 + 0.8) % 12, distanceStartCm: 1, distanceEndCm: 2.5, grade: "lsil", vessels: [], clientKey: randomUUID() });

// Slots are the prepared draft visits (100); each keeps the versions it has seen. Requests take
// slots round-robin, and a slot's state is updated from each response, so its next use (≥ 20
// builds later) sends the latest version. The warm-up uses slots 0–19, the timed pass 20–99, so a
// warm-up request cut off mid-flight leaves no stale version for the timed pass.
// (autocannon clears its per-connection context after each pass through the request list, and
// builds every connection's first request before any is sent, into a buffer shared by all
// connections: so the first build of a pass is a harmless GET, and no state lives in the context.)
for (const [i, slot] of prep.slots.entries()) Object.assign(slot, { n: 0, step: i, visitVersion: 1, lesion: { id: slot.lesionId, version: 1 } });
let pool = [];
let cursor = 0;
let answered = false;
function takeSlots(from, to) {
  pool = prep.slots.slice(from, to);
  cursor = 0;
  answered = false;
  for (const slot of pool) slot.busy = false;
}
// The next slot with no request of its own in flight: under a slow machine a request can outlast a
// round of the slots, and a second request on its slot would send a version it is about to change
// (a 409 we staged, not a lost update).
function nextSlot() {
  for (let tries = 0; tries < pool.length; tries++) {
    const slot = pool[cursor++ % pool.length];
    if (!slot.busy) return Object.assign(slot, { busy: true });
  }
  return pool[cursor++ % pool.length];
}

const steps = [
  {
    name: "timeline",
    build: (ctx) => {
      const pid = prep.demoPatients.length ? prep.demoPatients[ctx.slot.n % prep.demoPatients.length] : ctx.slot.patientId;
      return { method: "GET", path: `/api/patients/${pid}/timeline` };
    },
  },
  { name: "list", build: (ctx) => ({ method: "GET", path: `/api/visits/${ctx.slot.visitId}/lesions` }) },
  {
    name: "create",
    build: (ctx) => ({ method: "POST", path: `/api/visits/${ctx.slot.visitId}/lesions`, body: JSON.stringify(lesionBody(ctx.slot.n++)) }),
    after: (status, body, ctx) => {
      if (status === 201) ctx.slot.lesion = JSON.parse(body).lesion;
    },
  },
  {
    name: "update",
    // The lesion this connection created or updated last (at first, the one its visit started with).
    build: (ctx) => {
      const l = ctx.slot.lesion;
      return { method: "PATCH", path: `/api/visits/${ctx.slot.visitId}/lesions/${l.id}`, body: JSON.stringify({ version: l.version, grade: "hsil", sizeMm: 4 }) };
    },
    after: (status, body, ctx) => {
      if (status === 200) ctx.slot.lesion = JSON.parse(body).lesion;
    },
  },
  {
    name: "save-visit",
    build: (ctx) => ({
      method: "PATCH",
      path: `/api/visits/${ctx.slot.visitId}`,
      body: JSON.stringify({ version: ctx.slot.visitVersion, visitDate: "2026-02-01", patientPosition: "lithotomy", cytology: "lsil", hpvResult: "not_done", plan: `Review in 6 months (${ctx.slot.n})` }),
    }),
    after: (status, body, ctx) => {
      if (status === 200) ctx.slot.visitVersion = JSON.parse(body).visit.version;
    },
  },
];

// One request entry: each slot walks the steps in order from its own starting step, so the 50
// connections spread over the whole mix from the first second.
const mix = [
  {
    setupRequest: (req, ctx) => {
      if (!answered) {
        // Built before any answer: all connections will send this same buffer once. A read.
        ctx.slot = pool[0];
        ctx.current = steps[1];
      } else {
        ctx.slot = nextSlot();
        ctx.current = steps[ctx.slot.step++ % steps.length];
      }
      // A fresh headers object each time: the request builder writes Content-Length into it.
      return { ...req, ...ctx.current.build(ctx), headers: { ...headers } };
    },
    onResponse: (status, body, ctx) => {
      answered = true;
      ctx.slot.busy = false;
      note(status, ctx.current.name);
      ctx.current.after?.(status, body, ctx);
    },
  },
];

// A short warm-up of each (route code loaded, pool connections open, JIT warm) before the timed pass.
const warm = { duration: 3, connections: 10 };
// A pause before each timed pass, so requests a previous pass left in flight (autocannon stops
// without waiting for them) are answered before the next pass opens its connections.
const settle = () => new Promise((r) => setTimeout(r, 1000));
const timed = async (opts) => {
  await settle();
  return run(opts);
};
await run({ ...warm, requests: [{ method: "GET", path: "/api/ping" }] });
const floor = await timed({ requests: [{ method: "GET", path: "/api/ping" }] });
// A new request list for each pass, as for the floor (autocannon writes into the objects it is given).
const sessionOnly = () => [{ method: "GET", path: "/api/me/preferences", headers: { cookie: prep.cookie } }];
await run({ ...warm, requests: sessionOnly() });
const signedIn = await timed({ requests: sessionOnly() });
const floorBody = JSON.stringify({ clockStartH: 1, clockEndH: 1.8, distanceStartCm: 1, distanceEndCm: 2.5, grade: "lsil", vessels: [], clientKey: randomUUID() });
const writeFloorReq = () => [{ method: "POST", path: "/api/bench/write-floor", headers: { ...headers }, body: floorBody }];
await run({ ...warm, requests: writeFloorReq() });
const writeFloor = await timed({ requests: writeFloorReq() });
takeSlots(0, 20);
await run({ ...warm, requests: mix });
takeSlots(20, prep.slots.length);
for (const k of Object.keys(statusCounts)) delete statusCounts[k];
conflicts = 0;
const real = await timed({ requests: mix });
// Summed now: the passes below count their answers in the same tallies.
const r = summary(real, { conflicts409: conflicts, byStep: { ...statusCounts } });

// Creates alone, then updates alone (each a real change: the grade turns between HSIL and LSIL),
// with the CPU used per answered request.
const serverPid = Number(process.env.SERVER_PID);
const postmasterPid = Number(process.env.PG_POSTMASTER_PID) || 0;
const onePass = (step) => [
  {
    setupRequest: (req, ctx) => {
      ctx.slot = answered ? nextSlot() : pool[0];
      ctx.current = answered ? step : steps[1];
      return { ...req, ...ctx.current.build(ctx), headers: { ...headers } };
    },
    onResponse: (status, body, ctx) => {
      answered = true;
      ctx.slot.busy = false;
      note(status, ctx.current.name);
      ctx.current.after?.(status, body, ctx);
    },
  },
];
const toggle = {
  name: "update",
  build: (ctx) => {
    const l = ctx.slot.lesion;
    return { method: "PATCH", path: `/api/visits/${ctx.slot.visitId}/lesions/${l.id}`, body: JSON.stringify({ version: l.version, grade: l.grade === "hsil" ? "lsil" : "hsil" }) };
  },
  after: steps[3].after,
};
async function cpuPass(step) {
  takeSlots(20, prep.slots.length);
  await settle();
  const ok = () => Object.entries(statusCounts).filter(([k]) => k.startsWith(`${step.name} 2`)).reduce((a, [, n]) => a + n, 0);
  const okBefore = ok();
  const before = cpuNow(serverPid, postmasterPid);
  // No probe here: its requests would be counted in the CPU but not in the answers.
  const res = await run({ noProbe: true, requests: onePass(step) });
  const after = cpuNow(serverPid, postmasterPid);
  return { ...summary(res), cpu: serverPid ? cpuPerRequest(before, after, ok() - okBefore) : null };
}
const createOnly = await cpuPass(steps[2]);
const updateOnly = await cpuPass(toggle);
// The same reading for the write floor: what any signed-in write costs before its own work.
const floorOnly = await cpuPass({ name: "write-floor", build: () => ({ method: "POST", path: "/api/bench/write-floor", body: floorBody }) });
// And each other step of the mix alone (reported, so the mix's cost can be read step by step).
const mixSteps = {};
for (const step of [steps[0], steps[1], steps[4]]) mixSteps[step.name] = await cpuPass(step);

const f = summary(floor);
const a = summary(signedIn);
const wf = summary(writeFloor);
// Every pass: at least 90% of the connections busy on average, and no request left unanswered.
const passes = { floor: f, sessionFloor: a, writeFloor: wf, mix: r, createOnly, updateOnly, floorOnly, ...mixSteps };
const health = Object.entries(passes)
  .filter(([, p]) => p.busyConnections < 0.9 * connections || p.timeouts > 0)
  .map(([name, p]) => `${name}: ${p.busyConnections} of ${connections} connections busy, ${p.timeouts} timeouts, ${p.socketErrors} socket errors`);
console.log(JSON.stringify({
  connections, durationS: duration, floor: f, sessionFloor: { ...a, ...against(a, f) }, writeFloor: { ...wf, ...against(wf, f) }, mix: r, ...against(r, f),
  againstWriteFloor: against(r, wf), cpu: { create: createOnly.cpu, update: updateOnly.cpu }, floorCpu: floorOnly.cpu, mixStepCpu: Object.fromEntries(Object.entries(mixSteps).map(([k, v]) => [k, { ...v.cpu, reqPerSec: v.reqPerSec, p95Ms: v.p95Ms, errors: v.errors }])), createOnly, updateOnly, health,
}));
