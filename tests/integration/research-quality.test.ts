// Clinic quality panel on invented visits whose figures are worked out by hand below, against
// the IANS 2016 practice standards (Hillman RJ et al., J Low Genit Tract Dis 2016;20:283-291;
// Hillman RJ et al., J Low Genit Tract Dis 2016): ≥ 50 HRAs a year, ≥ 20 HSIL cases, unsatisfactory cytology < 5%, cytological
// HSIL confirmed ≥ 90%, HRA under 15 minutes in > 90%, problematic pain or bleeding ≤ 10%.
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import * as s from "@/db/schema";
import { loadQualityPanel, refreshQualityFigures, type SiteQuality } from "@/lib/server/research";
import { makePatient, makeSite, makeUser } from "../fixtures/factory";

type Cyto = (typeof s.visits.$inferInsert)["cytology"];
let panel: SiteQuality[];
let e1: string;
let site: string;
let p3id: string;

async function visit(o: { patientId: string; siteId: string; examinerId: string; date: string; cytology: Cyto; minutes?: number; histology?: "hsil" | "lsil"; pain?: "mild" | "moderate" | "severe"; bleeding?: "mild" | "moderate" | "severe"; draft?: boolean }) {
  const start = new Date(`${o.date}T09:00:00Z`);
  const [v] = await db.insert(s.visits).values({
    patientId: o.patientId, siteId: o.siteId, examinerId: o.examinerId, visitDate: o.date, cytology: o.cytology,
    status: o.draft ? "draft" : "signed", signedAt: o.draft ? null : new Date(),
    examStartedAt: o.minutes === undefined ? null : start, examEndedAt: o.minutes === undefined ? null : new Date(start.getTime() + o.minutes * 60_000),
  }).returning({ id: s.visits.id });
  if (o.histology) await db.insert(s.biopsies).values({ visitId: v!.id, siteId: o.siteId, specimenLabel: "A", clockH: 1, distanceCm: 1, histology: o.histology });
  if (o.pain) await db.insert(s.complications).values({ visitId: v!.id, siteId: o.siteId, kind: "pain", severity: o.pain });
  if (o.bleeding) await db.insert(s.complications).values({ visitId: v!.id, siteId: o.siteId, kind: "bleeding", severity: o.bleeding });
}

beforeAll(async () => {
  site = (await makeSite("Quality")).id;
  e1 = await makeUser("clinician", [site]);
  const e2 = await makeUser("clinician", [site]);
  const [p1, p2, p3, p4, p5] = await Promise.all([1, 2, 3, 4, 5].map(() => makePatient(site)));
  const base = { siteId: site };
  await visit({ ...base, examinerId: e1, patientId: p1!.id, date: "2025-02-01", cytology: "hsil", minutes: 10, histology: "hsil" });
  await visit({ ...base, examinerId: e1, patientId: p1!.id, date: "2025-03-01", cytology: "unsatisfactory", minutes: 20, histology: "hsil", pain: "moderate" });
  await visit({ ...base, examinerId: e1, patientId: p2!.id, date: "2025-04-01", cytology: "hsil", minutes: 12, histology: "lsil", bleeding: "mild" });
  await visit({ ...base, examinerId: e1, patientId: p3!.id, date: "2025-05-01", cytology: "nilm" });
  await visit({ ...base, examinerId: e2, patientId: p4!.id, date: "2025-06-01", cytology: "not_done", minutes: 14, histology: "hsil", bleeding: "severe" });
  // Outside the year, and a draft: neither counts.
  await visit({ ...base, examinerId: e1, patientId: p5!.id, date: "2024-12-31", cytology: "unsatisfactory", minutes: 40 });
  await visit({ ...base, examinerId: e1, patientId: p5!.id, date: "2025-07-01", cytology: "unsatisfactory", minutes: 40, draft: true });
  p3id = p3!.id;
  panel = (await loadQualityPanel({ userId: "test", siteIds: [site] }, 2025)).sites;
});

const values = (metrics: SiteQuality["site"]) => Object.fromEntries(metrics.map((m) => [m.key, m.value === null ? null : Number(m.value.toFixed(3))]));

describe("quality panel for 2025", () => {
  it("computes one examiner's figures as worked by hand", () => {
    const mine = panel[0]!.examiners.find((e) => e.metrics[0]!.value === 4)!;
    // HRAs: 4 signed visits in 2025. HSIL cases: one patient (P1, twice). Unsatisfactory: 1 of 4 with
    // cytology = 0.25. Confirmed: HSIL cytology twice, histology HSIL once = 0.5. Timed 10, 20, 12 min:
    // 2 of 3 under 15 = 0.667. Moderate pain once in 4 visits = 0.25.
    expect(values(mine.metrics)).toEqual({ hra_volume: 4, hsil_cases: 1, unsatisfactory_cytology: 0.25, cytology_hsil_confirmed: 0.5, hra_under_15_min: 0.667, problematic_pain_or_bleeding: 0.25 });
    expect(mine.metrics.map((m) => m.met)).toEqual([false, false, false, false, false, false]);
  });

  it("computes the site's figures as worked by hand", () => {
    // 5 visits; HSIL patients P1 and P4 = 2; cytology done in 4, 1 unsatisfactory = 0.25; confirmed 1 of 2;
    // timed 10, 20, 12, 14 → 3 of 4 under 15 = 0.75; moderate pain + severe bleeding = 2 of 5 = 0.4.
    expect(values(panel[0]!.site)).toEqual({ hra_volume: 5, hsil_cases: 2, unsatisfactory_cytology: 0.25, cytology_hsil_confirmed: 0.5, hra_under_15_min: 0.75, problematic_pain_or_bleeding: 0.4 });
    expect(panel[0]!.examiners).toHaveLength(2);
  });

  it("serves the stored figures with their time; a visit signed later counts after the refresh", async () => {
    // The panel's figures are stored (lib/server/stored-figures.ts): within their age the same
    // figures and time come back; working them out again counts the new visit (5 → 6 HRAs).
    const first = await loadQualityPanel({ userId: "test", siteIds: [site] }, 2025);
    await visit({ siteId: site, examinerId: e1, patientId: p3id, date: "2025-08-01", cytology: "nilm" });
    const stored = await loadQualityPanel({ userId: "test", siteIds: [site] }, 2025);
    expect(stored.asOf).toBe(first.asOf);
    expect(values(stored.sites[0]!.site).hra_volume).toBe(5);
    await refreshQualityFigures([site], 2025);
    const fresh = await loadQualityPanel({ userId: "test", siteIds: [site] }, 2025);
    expect(values(fresh.sites[0]!.site).hra_volume).toBe(6);
    expect(Date.parse(fresh.asOf)).toBeGreaterThan(Date.parse(first.asOf));
  });
});
