// Headless Debian Chromium driven by playwright-core against the app that scripts/test.sh
// started (BASE_URL).
import { expect } from "vitest";
import { mkdtempSync, mkdirSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { chromium, type BrowserContext, type Page } from "playwright-core";
import { radiusOfCm, VIEW } from "@/lib/map/geometry";
import { overlapH } from "@/lib/geometry";
import { decodeTimeline, type TimelineWire } from "@/lib/timeline/wire";

export const BASE_URL = process.env.DENTATE_BASE_URL ?? "http://127.0.0.1:3100";
export const DEMO_PASSWORD = "Demo-pass-2026";
export const SHOTS = path.resolve(__dirname, "screenshots");

export async function launch(opts: { width?: number; height?: number; touch?: boolean } = {}): Promise<BrowserContext> {
  return chromium.launchPersistentContext(mkdtempSync(path.join(tmpdir(), "dentate-chromium-")), {
    executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
    headless: true,
    viewport: { width: opts.width ?? 1280, height: opts.height ?? 900 },
    hasTouch: opts.touch ?? false,
    args: ["--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync"],
  });
}

export async function signIn(page: Page, email: string, password = DEMO_PASSWORD): Promise<void> {
  await page.goto(`${BASE_URL}/sign-in`);
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL((u) => u.pathname !== "/sign-in" && u.pathname !== "/");
}

export async function screenshot(page: Page, name: string): Promise<void> {
  mkdirSync(SHOTS, { recursive: true });
  await page.screenshot({ path: path.join(SHOTS, `${name}.png`), fullPage: true });
}

/** A JSON call to the app with the page's session (and the Origin a browser would send on POST). */
export async function api<T>(page: Page, method: "GET" | "POST", urlPath: string, body?: unknown): Promise<T> {
  const res = method === "GET"
    ? await page.request.get(`${BASE_URL}${urlPath}`)
    : await page.request.post(`${BASE_URL}${urlPath}`, { data: body ?? {}, headers: { origin: BASE_URL } });
  if (!res.ok()) throw new Error(`${method} ${urlPath} → ${res.status()} ${await res.text()}`);
  return (await res.json()) as T;
}

/**
 * Signing asks for a decision on every earlier track still to look for at the visit: this marks
 * each undecided one (through the API, as the Look again list would) so a test that is about
 * something else can sign. Returns the labels it marked.
 */
export async function decideEarlierTracks(page: Page, visitId: string, outcome: "not_found" | "not_examined" = "not_found"): Promise<string[]> {
  const ctx = await api<{ ghosts: { trackId: string; trackLabel: string; foundHere: boolean; checkHere: string | null }[] }>(page, "GET", `/api/visits/${visitId}/tracks`);
  const open = ctx.ghosts.filter((g) => !g.foundHere && !g.checkHere);
  for (const g of open) await api(page, "POST", `/api/visits/${visitId}/tracks`, { action: "check", trackId: g.trackId, outcome });
  return open.map((g) => g.trackLabel);
}

/** In the signing prompt, answers every track still to look for with one choice, by its buttons. */
export async function answerSigningPrompt(page: Page, choice: "Not found" | "Not examined" = "Not examined"): Promise<void> {
  // Scoped to the prompt: the Look again list under the map has buttons of the same names.
  const prompt = page.locator("[data-signing-prompt]");
  await prompt.waitFor();
  const items = prompt.locator("[data-undecided]");
  while ((await items.count()) > 0) {
    const label = (await items.first().getAttribute("data-undecided"))!;
    const button = prompt.getByRole("button", { name: `${choice} ${label}`, exact: true });
    await expect.poll(() => button.isEnabled()).toBe(true);
    await button.click();
    await prompt.locator(`[data-undecided="${label}"]`).waitFor({ state: "detached" });
  }
}

/** A patient's timeline as the screens see it: the API sends columns (lib/timeline/wire), decoded here. */
export async function timelineOf<T>(page: Page, patientId: string): Promise<T> {
  return decodeTimeline<T>(await api<TimelineWire>(page, "GET", `/api/patients/${patientId}/timeline`));
}

export type Spot = { clockStartH: number; clockEndH: number; distanceStartCm: number; distanceEndCm: number };

/** One-hour arcs at 1–2 cm that touch none of the patient's earlier lesions, so only the test's own can match. */
export function freeSpots(lesions: Spot[]): Spot[] {
  const out: Spot[] = [];
  for (let h = 0; h < 12; h += 1.5) {
    const s = { clockStartH: h, clockEndH: (h + 1) % 12, distanceStartCm: 1, distanceEndCm: 2 };
    const clash = lesions.some((l) => overlapH({ startH: l.clockStartH, endH: l.clockEndH }, { startH: s.clockStartH, endH: s.clockEndH }) > 0 && l.distanceStartCm <= 2.5 && l.distanceEndCm >= 0.5);
    if (!clash) out.push(s);
  }
  return out;
}

/** Page coordinates of a display clock hour and a distance on the canal map, from its own radial scale. */
export async function mapPoint(page: Page, displayH: number, cm: number) {
  // The face: the first of the map's stacked layers, the one that holds its title.
  const svg = page.locator("[data-canal-map] > svg").filter({ has: page.locator("title", { hasText: "Canal map" }) }).first();
  // Buttons under the map scroll the page; the point must be on screen to be tapped.
  await svg.evaluate((el) => el.scrollIntoView({ block: "center" }));
  const box = (await svg.boundingBox())!;
  const s = Math.min(box.width / VIEW.width, box.height / VIEW.height);
  const ox = box.x + (box.width - VIEW.width * s) / 2;
  const oy = box.y + (box.height - VIEW.height * s) / 2;
  const a = (displayH * Math.PI) / 6;
  const r = radiusOfCm(cm);
  return { x: ox + (r * Math.sin(a) - VIEW.minX) * s, y: oy + (-r * Math.cos(a) - VIEW.minY) * s };
}
