// The canal map on a tablet: a clinician taps lesions (touch), sweeps one across 12 o'clock,
// grades it, reloads and finds everything; a reviewer sees the map and cannot change it.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BrowserContext, Page } from "playwright-core";
import type { VisitMapDto } from "@/lib/validation/lesions";
import { BASE_URL, launch, mapPoint, screenshot, signIn } from "./browser";

let browser: BrowserContext;
let visitUrl = "";
let visitId = "";

beforeAll(async () => {
  browser = await launch({ width: 1024, height: 768, touch: true });
});
afterAll(async () => {
  await browser?.close();
});

async function freshPage(): Promise<Page> {
  await browser.clearCookies();
  return browser.newPage();
}

/** A draft visit with an empty map: an existing one if the demo has it, else a new one. */
async function emptyDraftVisit(page: Page): Promise<{ patientId: string; visitId: string }> {
  const list = (await (await page.request.get(`${BASE_URL}/api/patients`)).json()) as { rows: { id: string }[] };
  for (const row of list.rows.slice(0, 15)) {
    const detail = (await (await page.request.get(`${BASE_URL}/api/patients/${row.id}`)).json()) as { visits: { id: string; status: string }[] };
    for (const v of detail.visits.filter((x) => x.status === "draft")) {
      const map = (await (await page.request.get(`${BASE_URL}/api/visits/${v.id}/lesions`)).json()) as VisitMapDto;
      if (map.lesions.length === 0 && !map.visit.readOnly) return { patientId: row.id, visitId: v.id };
    }
  }
  const patientId = list.rows[0]!.id;
  await page.goto(`${BASE_URL}/patients/${patientId}`);
  const created = await page.evaluate(async (url) => {
    const res = await fetch(url, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ visitDate: new Date().toISOString().slice(0, 10), patientPosition: "lithotomy" }) });
    return { status: res.status, body: await res.json() };
  }, `${BASE_URL}/api/patients/${patientId}/visits`);
  expect(created.status).toBe(201);
  const id = created.body.visit?.id ?? created.body.id;
  return { patientId, visitId: id };
}


async function lesionsOf(page: Page): Promise<VisitMapDto> {
  return (await (await page.request.get(`${BASE_URL}/api/visits/${visitId}/lesions`)).json()) as VisitMapDto;
}

const POLL = { timeout: 20_000, interval: 250 };
const rows = (page: Page) => page.locator("table tbody tr[aria-selected]");

describe("canal map on a touch tablet", () => {
  it("clinician: three taps, a sweep across 12 o'clock, a grade; all there after reload", async () => {
    const page = await freshPage();
    await signIn(page, "clinician@dentate.example");
    const ids = await emptyDraftVisit(page);
    visitId = ids.visitId;
    visitUrl = `${BASE_URL}/patients/${ids.patientId}/visits/${ids.visitId}`;
    await page.goto(visitUrl);
    await page.getByRole("radio", { name: "Lithotomy" }).click();
    await expect.poll(() => page.getByRole("button", { name: "New lesion" }).count(), POLL).toBe(1);

    // Lithotomy 3 o'clock = patient's left lateral (surgical anatomy texts).
    const p3 = await mapPoint(page, 3, 2);
    await page.touchscreen.tap(p3.x, p3.y);
    await expect.poll(() => rows(page).count(), POLL).toBe(1);
    const p6 = await mapPoint(page, 6, 1);
    await page.touchscreen.tap(p6.x, p6.y);
    const p9 = await mapPoint(page, 9, -2);
    await page.mouse.click(p9.x, p9.y);
    await expect.poll(() => rows(page).count(), POLL).toBe(3);

    // Sweep clockwise from 11 across 12 to 1 o'clock at 3.5 cm: an arc of 2 h, not 10.
    const from = await mapPoint(page, 11, 3.5);
    await page.mouse.move(from.x, from.y);
    await page.mouse.down();
    for (const h of [11.25, 11.5, 11.75, 0, 0.25, 0.5, 0.75, 1]) {
      const p = await mapPoint(page, h, 3.5);
      await page.mouse.move(p.x, p.y, { steps: 2 });
    }
    await page.mouse.up();
    await expect.poll(() => rows(page).count(), POLL).toBe(4);
    await page.getByRole("form", { name: /^Lesion / }).getByRole("radio", { name: "HSIL" }).check();
    await expect.poll(async () => (await lesionsOf(page)).lesions.filter((l) => l.grade === "hsil").length, POLL).toBe(1);
    await expect.poll(() => page.getByText("Saving…").count(), POLL).toBe(0);
    await screenshot(page, "canal-map-clinician");

    await page.reload();
    await expect.poll(() => rows(page).count(), POLL).toBe(4);
    // A reload opens the visit in the position it was examined in; the names below are lithotomy's.
    await page.getByRole("radio", { name: "Lithotomy" }).click();
    const saved = (await lesionsOf(page)).lesions;
    const swept = saved.find((l) => l.grade === "hsil")!;
    expect(swept.clockStartH).toBeCloseTo(11, 6);
    expect(swept.clockEndH).toBeCloseTo(1, 6);
    const tapped = saved.find((l) => Math.abs(l.clockStartH - 2.5) < 1e-6)!;
    expect(tapped.clockEndH).toBeCloseTo(3.5, 6);
    expect((tapped.distanceStartCm + tapped.distanceEndCm) / 2).toBeCloseTo(2, 6);
    // The perianal tap is stored with a negative distance (outside the verge).
    expect(saved.some((l) => l.distanceEndCm <= 0 || l.distanceStartCm < 0)).toBe(true);
    // The names follow the position chosen above once the map has re-drawn: wait for it.
    await expect.poll(() => page.getByRole("button", { name: /HSIL, 11 to 1 o'clock/ }).count(), POLL).toBe(1);
    await page.close();
  });

  it("reviewer: sees the map, has no editing controls, and a direct write is refused", async () => {
    expect(visitUrl).not.toBe("");
    const page = await freshPage();
    await signIn(page, "reviewer@dentate.example");
    await page.goto(visitUrl);
    await expect.poll(() => rows(page).count(), POLL).toBe(4);
    expect(await page.getByRole("button", { name: "New lesion" }).count()).toBe(0);
    expect(await page.getByText("Read only").count()).toBeGreaterThan(0);
    const p = await mapPoint(page, 4.5, 5);
    await page.touchscreen.tap(p.x, p.y);
    await page.waitForTimeout(500);
    expect(await rows(page).count()).toBe(4);
    await rows(page).first().click();
    const form = page.getByRole("form", { name: /^Lesion / });
    await expect.poll(() => form.count(), POLL).toBe(1);
    expect(await form.getByRole("radio", { name: "HSIL" }).isDisabled()).toBe(true);
    expect(await form.getByRole("textbox", { name: "Note" }).isDisabled()).toBe(true);
    expect(await page.getByRole("button", { name: /^Delete lesion/ }).count()).toBe(0);
    await screenshot(page, "canal-map-reviewer");

    const lesion = (await lesionsOf(page)).lesions[0]!;
    const statuses = await page.evaluate(
      async ({ base, lesionId, version }) => {
        const patch = await fetch(`${base}/${lesionId}`, { method: "PATCH", headers: { "content-type": "application/json" }, body: JSON.stringify({ grade: "benign", version }) });
        const post = await fetch(base, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ clockStartH: 1, clockEndH: 2, distanceStartCm: 1, distanceEndCm: 2, grade: "lsil" }) });
        return [patch.status, post.status];
      },
      { base: `${BASE_URL}/api/visits/${visitId}/lesions`, lesionId: lesion.id, version: lesion.version },
    );
    expect(statuses).toEqual([403, 403]);
    expect((await lesionsOf(page)).lesions.length).toBe(4);
    await page.close();
  });
});
