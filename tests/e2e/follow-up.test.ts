// Follow-up on a tablet: the earlier visit's lesions show as labelled outlines; the clinician
// re-finds one by tapping its outline (Found), re-draws another and accepts the suggested link,
// marks the third not found, adds one new lesion, and the timeline says persistent, persistent,
// regressed and new. The history is built through the API from the page's own session.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BrowserContext } from "playwright-core";
import path from "node:path";
import { api, BASE_URL, decideEarlierTracks, freeSpots, timelineOf, launch, mapPoint, screenshot, signIn, SHOTS, type Spot } from "./browser";

let browser: BrowserContext;
beforeAll(async () => {
  browser = await launch({ width: 1024, height: 768, touch: true });
});
afterAll(async () => {
  await browser?.close();
});

const POLL = { timeout: 20_000, interval: 250 };
type Made = { id: string; trackId: string; trackLabel: string; label: string };
const addDays = (iso: string, days: number) => new Date(Date.parse(`${iso}T00:00:00Z`) + days * 86_400_000).toISOString().slice(0, 10);
/** Two visit dates after the patient's last one and not after today (dates of care may not lie ahead): halfway, and today. */
const followUpDates = (lastDate: string): [string, string] => {
  const today = new Date().toISOString().slice(0, 10);
  const gap = Math.round((Date.parse(`${today}T00:00:00Z`) - Date.parse(`${lastDate}T00:00:00Z`)) / 86_400_000);
  return [addDays(lastDate, Math.max(1, Math.floor(gap / 2))), today];
};




describe("follow-up visit on a touch tablet", () => {
  it("re-finds two of three earlier lesions, marks one not found, adds one new; the timeline agrees", async () => {
    await browser.clearCookies();
    const page = await browser.newPage();
    await signIn(page, "clinician@dentate.example");

    // The demo patient with the fewest earlier tracks and four free places on the map.
    const { rows } = await api<{ rows: { id: string }[] }>(page, "GET", "/api/patients");
    let chosen: { id: string; spots: Spot[]; lastDate: string; tracks: number } | null = null;
    for (const p of rows.slice(0, 12)) {
      const t = await timelineOf<{ visits: { visitDate: string }[]; lesions: Spot[]; tracks: unknown[] }>(page, p.id);
      const spots = freeSpots(t.lesions);
      if (spots.length >= 4 && (!chosen || t.tracks.length < chosen.tracks)) chosen = { id: p.id, spots, lastDate: t.visits.map((v) => v.visitDate).sort().at(-1) ?? "2026-01-01", tracks: t.tracks.length };
    }
    expect(chosen, "a demo patient with four free places on the map").not.toBeNull();
    const { id: patientId, spots } = chosen!;

    // Visit 1, after every visit the patient already has: three lesions, signed.
    const { visit: v1 } = await api<{ visit: { id: string } }>(page, "POST", `/api/patients/${patientId}/visits`, { visitDate: followUpDates(chosen!.lastDate)[0], patientPosition: "lithotomy" });
    const grades = ["hsil", "lsil", "hsil"] as const;
    const first: Made[] = [];
    for (let i = 0; i < 3; i++) first.push((await api<{ lesion: Made }>(page, "POST", `/api/visits/${v1.id}/lesions`, { ...spots[i], grade: grades[i] })).lesion);
    await decideEarlierTracks(page, v1.id); // the demo patient's own earlier tracks: not found
    await api(page, "POST", `/api/visits/${v1.id}/sign`);
    const [a, b, c] = first as [Made, Made, Made];

    // Visit 2, opened in the browser.
    const { visit: v2 } = await api<{ visit: { id: string } }>(page, "POST", `/api/patients/${patientId}/visits`, { visitDate: followUpDates(chosen!.lastDate)[1], patientPosition: "lithotomy" });
    await page.goto(`${BASE_URL}/patients/${patientId}/visits/${v2.id}`);
    await page.getByRole("radio", { name: "Lithotomy" }).click();
    const look = (label: string) => page.getByRole("list", { name: "Earlier tracks" }).locator(`[data-look-again="${label}"]`);
    for (const m of first) await expect.poll(() => look(m.trackLabel).count(), POLL).toBe(1);
    await expect.poll(() => page.locator(`[data-ghost-label="${a.trackLabel}"]`).count(), POLL).toBe(1);
    await screenshot(page, "follow-up-ghosts");
    // The README's legend picture is this element (copy tests/e2e/screenshots/map-legend.png to public/docs/).
    await page.getByRole("region", { name: "Map legend" }).screenshot({ path: path.join(SHOTS, "map-legend.png") });

    // a: tap its outline on the map, then Found — a lesion is drawn there and linked in one go.
    await page.locator(`[data-ghost-hit="${a.trackId}"]`).scrollIntoViewIfNeeded(); // the legend shot above scrolled the page
    const hit = (await page.locator(`[data-ghost-hit="${a.trackId}"]`).boundingBox())!;
    await page.touchscreen.tap(hit.x + hit.width / 2, hit.y + hit.height / 2);
    const card = page.locator(`[data-ghost-card="${a.trackLabel}"]`);
    await expect.poll(() => card.count(), POLL).toBe(1);
    await card.getByRole("button", { name: `Found ${a.trackLabel}`, exact: true }).click();
    await expect.poll(() => look(a.trackLabel).getAttribute("data-state"), POLL).toBe("found");

    // b: drawn fresh by a sweep along its earlier arc (starting clear of the outline's label).
    const from = await mapPoint(page, spots[1]!.clockStartH + 0.05, 1.5);
    await page.mouse.move(from.x, from.y);
    await page.mouse.down();
    for (const dh of [0.25, 0.5, 0.75, 0.95]) {
      const p = await mapPoint(page, spots[1]!.clockStartH + dh, 1.5);
      await page.mouse.move(p.x, p.y, { steps: 2 });
    }
    await page.mouse.up();

    // c: looked for and not found.
    await look(c.trackLabel).getByRole("button", { name: `Not found ${c.trackLabel}`, exact: true }).click();
    await expect.poll(() => look(c.trackLabel).getAttribute("data-state"), POLL).toBe("not_found");

    // A new lesion at a fourth free place, by a tap.
    const p4 = await mapPoint(page, spots[3]!.clockStartH + 0.5, 1.5);
    await page.touchscreen.tap(p4.x, p4.y);

    // The fresh lesion along b's arc is suggested for b with its reason; the other matches nothing.
    const suggestion = page.locator("[data-suggestion]").filter({ hasText: `looks like ${b.trackLabel}` });
    await expect.poll(() => suggestion.count(), POLL).toBe(1);
    expect(await suggestion.textContent()).toMatch(/Why: overlaps \d+% of .*same zone/);
    await expect.poll(() => page.locator("[data-suggestion]").filter({ hasText: "matches no earlier track" }).count(), POLL).toBe(1);
    await page.getByRole("button", { name: "Accept all" }).click();
    await expect.poll(() => look(b.trackLabel).getAttribute("data-state"), POLL).toBe("found");
    await expect.poll(() => page.getByText("Saving…").count(), POLL).toBe(0);
    await screenshot(page, "follow-up-done");

    // What the server now holds, and the statuses it derived (issue 5 definitions: re-found at
    // the same grade untreated = persistent; not found without treatment = regressed; first seen = new).
    const lesions = (await api<{ lesions: { id: string; trackId: string; grade: string }[] }>(page, "GET", `/api/visits/${v2.id}/lesions`)).lesions;
    expect(lesions).toHaveLength(3);
    const fresh = lesions.find((l) => ![a.trackId, b.trackId].includes(l.trackId))!;
    expect(lesions.filter((l) => l.trackId === a.trackId)).toHaveLength(1);
    expect(lesions.filter((l) => l.trackId === b.trackId)).toHaveLength(1);
    // Statuses come from signed visits: none at the draft; its remaining (demo) tracks decided, it signs.
    const draftStatuses = await timelineOf<{ statuses: { visitId: string }[] }>(page, patientId);
    expect(draftStatuses.statuses.filter((s) => s.visitId === v2.id)).toEqual([]);
    await decideEarlierTracks(page, v2.id);
    await api(page, "POST", `/api/visits/${v2.id}/sign`);
    const timeline = await timelineOf<{ statuses: { trackId: string; visitId: string; status: string }[] }>(page, patientId);
    const at2 = new Map(timeline.statuses.filter((s) => s.visitId === v2.id).map((s) => [s.trackId, s.status]));
    expect(at2.get(a.trackId)).toBe("persistent");
    expect(at2.get(b.trackId)).toBe("persistent");
    expect(at2.get(c.trackId)).toBe("regressed");
    expect(at2.get(fresh.trackId)).toBe("new");
    await page.close();
  });
});
