// IANS 2016 metric "cytological HSIL confirmed as histological HSIL" (Hillman RJ et al., J Low Genit
// Tract Dis 2016;20:283-291): the referral cytology is usually taken at an earlier visit than the HRA
// that biopsies, so a biopsy of the same patient within the window after it counts. The 180-day
// window is a local default, from memory (CYTOLOGY_CONFIRMATION_WINDOW_DAYS).
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import * as s from "@/db/schema";
import { loadQualityPanel, type SiteQuality } from "@/lib/server/research";
import { makePatient, makeSite, makeUser } from "../fixtures/factory";

type Cyto = (typeof s.visits.$inferInsert)["cytology"];
let site: string;

async function visit(patientId: string, examinerId: string, date: string, cytology: Cyto, histology?: "hsil" | "lsil") {
  const [v] = await db.insert(s.visits).values({ patientId, siteId: site, examinerId, visitDate: date, cytology, status: "signed", signedAt: new Date() }).returning({ id: s.visits.id });
  if (histology) await db.insert(s.biopsies).values({ visitId: v!.id, siteId: site, specimenLabel: "A", clockH: 1, distanceCm: 1, histology });
}

const confirmed = (panel: SiteQuality[]) => panel[0]!.site.find((m) => m.key === "cytology_hsil_confirmed")!.value;

beforeAll(async () => {
  site = (await makeSite("Window")).id;
  const e = await makeUser("clinician", [site]);
  const [p, q, r] = await Promise.all([1, 2, 3].map(() => makePatient(site)));
  // P: HSIL cytology, biopsy HSIL 42 days later at the HRA: confirmed.
  await visit(p!.id, e, "2025-02-01", "hsil");
  await visit(p!.id, e, "2025-03-15", "not_done", "hsil");
  // R: HSIL cytology, biopsy LSIL 59 days later: not confirmed.
  await visit(r!.id, e, "2025-03-01", "hsil");
  await visit(r!.id, e, "2025-04-29", "not_done", "lsil");
  // Q: HSIL cytology, the only biopsy 295 days later: outside the window, so still unresolved.
  await visit(q!.id, e, "2025-01-10", "hsil");
  await visit(q!.id, e, "2025-11-01", "not_done", "hsil");
});

describe("cytological HSIL confirmed by a later biopsy", () => {
  it("counts biopsies of the same patient within the default window: 1 of 2", async () => {
    // P confirmed, R not, Q outside 180 days and left out: 1 / 2 = 0.5 (worked by hand).
    expect(confirmed((await loadQualityPanel({ userId: "test", siteIds: [site] }, 2025)).sites)).toBe(0.5);
  });
  it("takes the window as a setting: at 365 days Q's biopsy counts too, 2 of 3", async () => {
    // As above with Q confirmed at day 295: 2 / 3 (worked by hand).
    expect(confirmed((await loadQualityPanel({ userId: "test", siteIds: [site] }, 2025, 365)).sites)).toBeCloseTo(2 / 3, 6);
  });
});
