// Scale-out: the app keeps no state in its process, so two `next start` instances on one database
// behave as one. A second instance runs beside the one scripts/test.sh started (same build folder,
// same DATABASE_URL, S3_* and SMTP_* inherited): a session made on A works on B, a lesion
// written on B is read on A.
import { spawn, type ChildProcess } from "node:child_process";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BrowserContext, Page } from "playwright-core";
import { BASE_URL, launch, signIn } from "./browser";

const ROOT = path.resolve(__dirname, "../..");
const portA = Number(new URL(BASE_URL).port || 80);
const SECOND_PORT = Number(process.env.DENTATE_TEST_SECOND_PORT ?? portA + 10);
const B_URL = `http://127.0.0.1:${SECOND_PORT}`;

let second: ChildProcess | null = null;
let secondLog = "";
let browser: BrowserContext;
let page: Page;

async function waitUp(url: string, ms: number): Promise<void> {
  const end = Date.now() + ms;
  while (Date.now() < end) {
    if (second?.exitCode != null) throw new Error(`second instance exited:\n${secondLog.slice(-2000)}`);
    try {
      const r = await fetch(url, { redirect: "manual", signal: AbortSignal.timeout(2_000) });
      if (r.status < 500) return;
    } catch {}
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`${url} did not answer within ${ms} ms:\n${secondLog.slice(-2000)}`);
}

beforeAll(async () => {
  second = spawn(path.join(ROOT, "node_modules/.bin/next"), ["start", "-H", "127.0.0.1", "-p", String(SECOND_PORT)], {
    cwd: ROOT,
    env: { ...process.env, DENTATE_DIST_DIR: process.env.DENTATE_DIST_DIR ?? ".next-test", NEXT_TELEMETRY_DISABLED: "1", NODE_OPTIONS: "--require=./scripts/peer-address.cjs" },
    stdio: ["ignore", "pipe", "pipe"],
    detached: true, // its own process group, so the whole of it can be stopped at the end
  });
  second.stdout!.on("data", (d) => (secondLog += d));
  second.stderr!.on("data", (d) => (secondLog += d));
  browser = await launch();
  page = await browser.newPage();
  await Promise.all([waitUp(`${B_URL}/sign-in`, 40_000), signIn(page, "clinician@dentate.example")]);
}, 60_000);

afterAll(async () => {
  await browser?.close();
  if (second?.pid && second.exitCode == null) {
    const exited = new Promise((r) => second!.once("exit", r));
    try {
      process.kill(-second.pid, "SIGTERM");
    } catch {}
    await Promise.race([exited, new Promise((r) => setTimeout(r, 5_000))]);
    if (second.exitCode == null && second.signalCode == null) {
      try {
        process.kill(-second.pid, "SIGKILL");
      } catch {}
    }
  }
});

describe("two instances on one database", () => {
  it("accepts on B the session made on A, and each reads what the other wrote", async () => {
    const started = Date.now();
    const cookie = (await browser.cookies(BASE_URL)).map((c) => `${c.name}=${c.value}`).join("; ");
    expect(cookie).not.toBe("");

    // Without the cookie B refuses, so the 200 below is the session from A at work.
    expect((await fetch(`${B_URL}/api/patients`)).status).toBe(401);
    const list = await fetch(`${B_URL}/api/patients`, { headers: { cookie } });
    expect(list.status).toBe(200);
    const patientId = ((await list.json()) as { rows: { id: string }[] }).rows[0]!.id;
    const patientOnB = await fetch(`${B_URL}/api/patients/${patientId}`, { headers: { cookie } });
    expect(patientOnB.status).toBe(200);

    // A page on B renders for the same browser session (cookies are per host, not per port).
    await page.goto(`${B_URL}/patients/${patientId}`);
    expect(new URL(page.url()).pathname).toBe(`/patients/${patientId}`);

    // Write on B, read on A.
    const visit = await fetch(`${B_URL}/api/patients/${patientId}/visits`, {
      method: "POST",
      headers: { "content-type": "application/json", origin: B_URL, cookie },
      body: JSON.stringify({ visitDate: "2026-06-02", patientPosition: "lithotomy", indication: "Surveillance" }),
    });
    expect(visit.status).toBe(201);
    const visitId = ((await visit.json()) as { visit: { id: string } }).visit.id;
    const lesion = await fetch(`${B_URL}/api/visits/${visitId}/lesions`, {
      method: "POST",
      headers: { "content-type": "application/json", origin: B_URL, cookie },
      body: JSON.stringify({ clockStartH: 3, clockEndH: 4.5, distanceStartCm: 0.5, distanceEndCm: 1.5, grade: "hsil", note: "written on instance B" }),
    });
    expect(lesion.status).toBe(201);
    const lesionId = ((await lesion.json()) as { lesion: { id: string } }).lesion.id;

    const onA = await fetch(`${BASE_URL}/api/visits/${visitId}/lesions`, { headers: { cookie } });
    expect(onA.status).toBe(200);
    const lesions = ((await onA.json()) as { lesions: { id: string; note: string | null }[] }).lesions;
    expect(lesions.find((l) => l.id === lesionId)?.note).toBe("written on instance B");
    expect(Date.now() - started).toBeLessThan(30_000);
  });
});
