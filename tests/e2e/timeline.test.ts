// Follow-up tracking end to end: a clinician re-finds two of three earlier lesions and adds one
// new, accepts the suggested links; the reviewer disagrees with one status on Compare; the
// clinician sees the disagreement. Lesions are drawn through the API from the page's session
// (the map editor's follow-up gestures are tested with the editor).
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BrowserContext, Page } from "playwright-core";
import { api, BASE_URL, decideEarlierTracks, freeSpots, timelineOf, launch, screenshot, signIn, type Spot } from "./browser";

let browser: BrowserContext;
beforeAll(async () => {
  browser = await launch({ width: 1280, height: 900 });
});
afterAll(async () => {
  await browser?.close();
});

async function freshPage(email: string): Promise<Page> {
  await browser.clearCookies();
  const page = await browser.newPage();
  await signIn(page, email);
  return page;
}


const addDays = (iso: string, days: number) => new Date(Date.parse(`${iso}T00:00:00Z`) + days * 86_400_000).toISOString().slice(0, 10);
/** Two visit dates after the patient's last one and not after today (dates of care may not lie ahead): halfway, and today. */
const followUpDates = (lastDate: string): [string, string] => {
  const today = new Date().toISOString().slice(0, 10);
  const gap = Math.round((Date.parse(`${today}T00:00:00Z`) - Date.parse(`${lastDate}T00:00:00Z`)) / 86_400_000);
  return [addDays(lastDate, Math.max(1, Math.floor(gap / 2))), today];
};


const state = {} as { patientId: string; earlierId: string; laterId: string; trackLabels: Record<string, string>; refound: string[]; lost: string; fresh: string; disputed: string };
/** Pages load their data through SWR after the first paint; a shared machine can be slow. */
const WAIT = { timeout: 20_000, interval: 250 };
const COMMENT = "Denser acetowhite than last time; I would call this progressed.";

describe("follow-up tracking, compare and review", () => {
  it("clinician: opens a follow-up visit, re-finds two of three lesions, adds one new, accepts the suggested links", async () => {
    const page = await freshPage("clinician@dentate.example");
    const { rows } = await api<{ rows: { id: string }[] }>(page, "GET", "/api/patients");
    let chosen: { id: string; spots: Spot[]; lastDate: string } | null = null;
    for (const p of rows) {
      const t = await timelineOf<{ visits: { visitDate: string }[]; lesions: Spot[] }>(page, p.id);
      const spots = freeSpots(t.lesions);
      if (spots.length >= 4) {
        chosen = { id: p.id, spots, lastDate: t.visits.map((v) => v.visitDate).sort().at(-1) ?? "2026-01-01" };
        break;
      }
    }
    expect(chosen, "a demo patient with four free places on the map").not.toBeNull();
    const { id: patientId, spots } = chosen!;
    state.patientId = patientId;

    // The earlier visit: three lesions, signed.
    const { visit: earlier } = await api<{ visit: { id: string } }>(page, "POST", `/api/patients/${patientId}/visits`, { visitDate: followUpDates(chosen!.lastDate)[0], patientPosition: "lithotomy" });
    state.earlierId = earlier.id;
    const grades = ["hsil", "lsil", "hsil"] as const;
    const first: { id: string; trackId: string; trackLabel: string }[] = [];
    for (let i = 0; i < 3; i++) first.push((await api<{ lesion: { id: string; trackId: string; trackLabel: string } }>(page, "POST", `/api/visits/${earlier.id}/lesions`, { ...spots[i], grade: grades[i] })).lesion);
    await decideEarlierTracks(page, earlier.id); // the demo patient's own earlier tracks: not found
    await api(page, "POST", `/api/visits/${earlier.id}/sign`);

    // The follow-up visit, opened in the browser.
    const { visit: later } = await api<{ visit: { id: string } }>(page, "POST", `/api/patients/${patientId}/visits`, { visitDate: followUpDates(chosen!.lastDate)[1], patientPosition: "lithotomy" });
    state.laterId = later.id;
    const opened = await page.goto(`${BASE_URL}/patients/${patientId}/visits/${later.id}`);
    expect(opened?.status()).toBe(200);

    // Re-found: the first two, a quarter hour round; new: a fourth free place. The third is not found.
    const shift = (s: Spot) => ({ ...s, clockStartH: (s.clockStartH + 0.25) % 12, clockEndH: (s.clockEndH + 0.25) % 12 });
    const again0 = (await api<{ lesion: { id: string } }>(page, "POST", `/api/visits/${later.id}/lesions`, { ...shift(spots[0]!), grade: "hsil" })).lesion;
    const again1 = (await api<{ lesion: { id: string } }>(page, "POST", `/api/visits/${later.id}/lesions`, { ...shift(spots[1]!), grade: "lsil" })).lesion;
    const fresh = (await api<{ lesion: { id: string; trackId: string; trackLabel: string } }>(page, "POST", `/api/visits/${later.id}/lesions`, { ...spots[3], grade: "lsil" })).lesion;

    type Ctx = { ghosts: { trackId: string }[]; suggestions: { trackId: string; lesionId: string; explanation: string }[]; unmatchedLesionIds: string[] };
    const ctx = await api<Ctx>(page, "GET", `/api/visits/${later.id}/tracks`);
    expect(ctx.ghosts.map((g) => g.trackId)).toEqual(expect.arrayContaining(first.map((f) => f.trackId)));
    const byLesion = new Map(ctx.suggestions.map((s) => [s.lesionId, s]));
    expect(byLesion.get(again0.id)?.trackId).toBe(first[0]!.trackId);
    expect(byLesion.get(again1.id)?.trackId).toBe(first[1]!.trackId);
    expect(byLesion.get(again0.id)?.explanation.length).toBeGreaterThan(10);
    expect(ctx.unmatchedLesionIds).toContain(fresh.id);

    for (const s of [byLesion.get(again0.id)!, byLesion.get(again1.id)!]) await api(page, "POST", `/api/visits/${later.id}/tracks`, { action: "link", lesionId: s.lesionId, trackId: s.trackId });
    await api(page, "POST", `/api/visits/${later.id}/tracks`, { action: "check", trackId: first[2]!.trackId, outcome: "not_found" });
    await decideEarlierTracks(page, later.id);
    await api(page, "POST", `/api/visits/${later.id}/sign`);

    state.refound = [first[0]!.trackLabel, first[1]!.trackLabel];
    state.lost = first[2]!.trackLabel;
    state.fresh = fresh.trackLabel;
    state.disputed = first[0]!.trackLabel;

    // The timeline shows the follow-up: the re-found HSIL track is persistent (same grade, untreated),
    // the lost one regressed (not found without treatment), the fresh one new (the status definitions in lib/tracking).
    await page.goto(`${BASE_URL}/patients/${patientId}/timeline`);
    const row = (label: string) => page.locator(`tr[data-track-row="${label}"]`);
    await expect.poll(() => row(state.disputed).count(), WAIT).toBe(1);
    expect(await row(state.disputed).locator("td").last().getAttribute("data-status")).toBe("persistent");
    expect(await row(state.lost).locator("td").last().getAttribute("data-status")).toBe("regressed");
    expect(await row(state.fresh).locator("td").last().getAttribute("data-status")).toBe("new");
    // Selecting the track rings it on both maps where it was drawn.
    await row(state.disputed).getByRole("button").click();
    await expect.poll(() => page.locator('[data-lesion-id][aria-pressed="true"]').count(), WAIT).toBe(2);
    await screenshot(page, "timeline-clinician");
    await page.close();
  });

  it("reviewer: opens Compare, sees the differences, disagrees with one status with a comment, signs off", async () => {
    const page = await freshPage("reviewer@dentate.example");
    await page.goto(`${BASE_URL}/patients/${state.patientId}/compare?a=${state.earlierId}&b=${state.laterId}`);
    await expect.poll(() => page.locator("[data-diff-kind]").count(), WAIT).toBeGreaterThan(0);
    const newItem = page.locator('[data-diff-kind="new"]');
    await expect.poll(() => newItem.textContent(), WAIT).toContain(`${state.fresh} is new`);
    expect(await page.locator('[data-diff-kind="gone"]').textContent()).toContain(`${state.lost} is gone`);

    // Linked selection: choosing the new track in the list rings it on the later map only (it is absent from the earlier one).
    await newItem.getByRole("button").click();
    await expect.poll(() => page.locator('[data-compare-side="Later"] [data-lesion-id][aria-pressed="true"]').count(), WAIT).toBe(1);
    expect(await page.locator('[data-compare-side="Earlier"] [data-lesion-id][aria-pressed="true"]').count()).toBe(0);

    // Every track with a status at the later visit: our four, plus any earlier demo track the signed visit counted as looked for.
    const rows = page.locator("[data-adjudication-track]");
    await expect.poll(() => rows.count(), WAIT).toBeGreaterThanOrEqual(4);
    const labels = await rows.evaluateAll((els) => els.map((e) => e.getAttribute("data-adjudication-track")!));
    expect(labels).toEqual(expect.arrayContaining([...state.refound, state.lost, state.fresh]));
    const disputed = page.locator(`[data-adjudication-track="${state.disputed}"]`);
    await disputed.getByRole("button", { name: `Disagree with ${state.disputed}` }).click();
    await disputed.getByLabel("Status you believe").selectOption("progressed");
    await disputed.getByLabel("Comment").fill(COMMENT);
    await disputed.getByRole("button", { name: "Save disagreement" }).click();
    await expect.poll(() => disputed.locator("[data-verdict]").getAttribute("data-verdict"), WAIT).toBe("disagree");
    for (const label of labels.filter((l) => l !== state.disputed)) {
      const r = page.locator(`[data-adjudication-track="${label}"]`);
      await r.getByRole("button", { name: new RegExp(`^Agree with ${label}`) }).click();
      await expect.poll(() => r.locator("[data-verdict]").getAttribute("data-verdict"), WAIT).toBe("agree");
    }
    await page.getByRole("button", { name: "Sign off the review" }).click();
    await expect.poll(() => page.locator("[data-review-status]").getAttribute("data-review-status"), WAIT).toBe("signed_off");
    await screenshot(page, "compare-reviewer");
    await page.close();
  });

  it("clinician: sees the open disagreement with the reviewer's comment and a link back to Compare", async () => {
    const page = await freshPage("clinician@dentate.example");
    // The patient page shows it once the OpenDisagreements panel is mounted there; Compare always does.
    await page.goto(`${BASE_URL}/patients/${state.patientId}`);
    if ((await page.getByRole("heading", { name: "Open review disagreements" }).count()) === 0) {
      await page.goto(`${BASE_URL}/patients/${state.patientId}/compare?a=${state.earlierId}&b=${state.laterId}`);
    }
    const item = page.locator(`[data-disagreement="${state.disputed}"]`);
    await expect.poll(() => item.count(), WAIT).toBeGreaterThan(0);
    const text = (await item.first().textContent()) ?? "";
    expect(text).toContain(COMMENT);
    expect(text).toContain("Progressed");
    expect(await item.first().getByRole("link", { name: "Open in Compare" }).getAttribute("href")).toContain(`a=${state.earlierId}&b=${state.laterId}`);
    await page.goto(`${BASE_URL}/patients/${state.patientId}/compare?a=${state.earlierId}&b=${state.laterId}`);
    await expect.poll(() => page.locator("[data-disagreement]").count(), WAIT).toBeGreaterThan(0);
    await screenshot(page, "compare-clinician");
    await page.close();
  });
});
