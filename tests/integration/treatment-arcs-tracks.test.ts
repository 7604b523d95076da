import { beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import { treatments, visits } from "@/db/schema";
import { GET as visitLesions, POST as createLesion } from "@/app/api/visits/[visitId]/lesions/route";
import { POST as addTreatment } from "@/app/api/visits/[visitId]/treatments/route";
import { POST as trackAction } from "@/app/api/visits/[visitId]/tracks/route";
import { POST as sign } from "@/app/api/visits/[visitId]/sign/route";
import { GET as timeline } from "@/app/api/patients/[patientId]/timeline/route";
import { decodeTimeline } from "@/lib/timeline/wire";
import type { Timeline } from "@/lib/api/types";
import { actor, ctx, makePatient, makeSite, req, type Actor } from "../fixtures/factory";

// A treatment entered as treated arcs only, with no lesion named, treats the track of each lesion
// whose clock extent the arcs cover; a lesion reached in part is the clinician's call. Statuses:
// Liu Y, Sigel K, Gaisa MM, Papillomavirus Research 2018;5:S9 (disease at the treated site at the
// first look after treatment = persistent); a site clear after treatment reads "cleared", and
// disease back after such a clear visit "recurrent" (common practice, no single source), as
// lib/tracking/status.ts defines them.

let siteId: string;
let clinician: Actor;

beforeAll(async () => {
  siteId = (await makeSite()).id;
  clinician = await actor("clinician", [siteId]);
});

async function visit(patientId: string, date: string) {
  const [v] = await db.insert(visits).values({ patientId, siteId, visitDate: date, examinerId: clinician.userId }).returning({ id: visits.id });
  return v!.id;
}
const hsil = (clockStartH: number, clockEndH: number) => ({ clockStartH, clockEndH, distanceStartCm: 1, distanceEndCm: 2, grade: "hsil" });
async function lesion(visitId: string, body: unknown) {
  const res = await createLesion(req("POST", "/x", clinician, body), ctx({ visitId }));
  expect(res.status).toBe(201);
  return (await res.json()).lesion as { id: string; trackId: string; treated: boolean };
}
const treat = (visitId: string, body: unknown) => addTreatment(req("POST", `/api/visits/${visitId}/treatments`, clinician, body), ctx({ visitId }));
async function signVisit(visitId: string) {
  expect((await sign(req("POST", `/api/visits/${visitId}/sign`, clinician), ctx({ visitId }))).status).toBe(200);
}
async function statusOf(patientId: string, trackId: string, visitId: string) {
  const res = await timeline(req("GET", "/x", clinician), ctx({ patientId }));
  expect(res.status).toBe(200);
  const body = decodeTimeline<Timeline>(JSON.parse(await res.text()));
  return body.statuses.find((s) => s.trackId === trackId && s.visitId === visitId)?.status;
}

describe("a treatment entered as arcs only marks the covered lesion's track as treated", () => {
  it("reads cleared at the next clear visit and recurrent when HSIL returns at the site", async () => {
    const patientId = (await makePatient(siteId)).id;
    const v1 = await visit(patientId, "2025-01-10");
    const a = await lesion(v1, hsil(2, 4));
    // 1:30 → 4:30 covers 2 → 4 (overlap, not the same ends); no lesion named.
    const res = await treat(v1, { modality: "electrocautery", lesionId: null, arcs: [{ startH: 1.5, endH: 4.5 }] });
    expect(res.status).toBe(201);
    await signVisit(v1);

    const v2 = await visit(patientId, "2025-04-10");
    expect((await trackAction(req("POST", "/x", clinician, { action: "check", trackId: a.trackId, outcome: "not_found" }), ctx({ visitId: v2 }))).status).toBe(200);
    await signVisit(v2);
    // Untreated, a site found clear reads "regressed"; treated, "cleared".
    expect(await statusOf(patientId, a.trackId, v2)).toBe("cleared");

    const v3 = await visit(patientId, "2025-10-10");
    const back = await lesion(v3, hsil(2, 4));
    expect((await trackAction(req("POST", "/x", clinician, { action: "link", lesionId: back.id, trackId: a.trackId }), ctx({ visitId: v3 }))).status).toBe(200);
    // Statuses come from signed visits: none while v3 is a draft.
    expect(await statusOf(patientId, a.trackId, v3)).toBeUndefined();
    await signVisit(v3);
    // HSIL at the treated site after a clear visit: recurrent (untreated it would read persistent).
    expect(await statusOf(patientId, a.trackId, v3)).toBe("recurrent");
  });

  it("treats a lesion across 12 o'clock covered by two arcs that meet there, and shows it treated on the map", async () => {
    const patientId = (await makePatient(siteId)).id;
    const v1 = await visit(patientId, "2025-01-10");
    const a = await lesion(v1, hsil(11, 1));
    expect((await treat(v1, { modality: "infrared_coagulation", lesionId: null, arcs: [{ startH: 10.5, endH: 0 }, { startH: 0, endH: 1.5 }] })).status).toBe(201);
    const [t] = await db.select().from(treatments).where(eq(treatments.visitId, v1));
    expect(t!.treatedLesionIds).toEqual([a.id]);
    const other = await lesion(v1, hsil(5, 6)); // mapped after the treatment, untouched by its arcs
    const map = await (await visitLesions(req("GET", "/x", clinician), ctx({ visitId: v1 }))).json();
    const treatedOf = (id: string) => map.lesions.find((l: { id: string }) => l.id === id)?.treated;
    expect(treatedOf(a.id)).toBe(true);
    expect(treatedOf(other.id)).toBe(false);
  });

  it("asks about a lesion the arcs reach only in part, stores nothing until answered, then stores the answer", async () => {
    const patientId = (await makePatient(siteId)).id;
    const v1 = await visit(patientId, "2025-01-10");
    const inPart = await lesion(v1, hsil(3, 6)); // 4 → 8 covers 4 → 6 of it: in part
    const whole = await lesion(v1, hsil(6.5, 7.5)); // inside 4 → 8: fully
    const arcs = [{ startH: 4, endH: 8 }];
    const refused = await treat(v1, { modality: "electrocautery", lesionId: null, arcs, extentOverrideReason: null });
    expect(refused.status).toBe(400);
    const err = (await refused.json()).error;
    expect(Object.keys(err.fields)).toEqual(["partialCover"]);
    expect(err.fields.partialCover[0]).toMatch(/only in part/);
    expect(await db.select().from(treatments).where(eq(treatments.visitId, v1))).toHaveLength(0);

    expect((await treat(v1, { modality: "electrocautery", lesionId: null, arcs, partialCover: [{ lesionId: inPart.id, treated: false }] })).status).toBe(201);
    const [t] = await db.select().from(treatments).where(eq(treatments.visitId, v1));
    expect(t!.treatedLesionIds).toEqual([whole.id]);
    await signVisit(v1);
    const v2 = await visit(patientId, "2025-04-10");
    for (const trackId of [inPart.trackId, whole.trackId]) {
      expect((await trackAction(req("POST", "/x", clinician, { action: "check", trackId, outcome: "not_found" }), ctx({ visitId: v2 }))).status).toBe(200);
    }
    await signVisit(v2);
    // The clinician said the partly reached lesion was not treated: its site reads regressed.
    expect(await statusOf(patientId, whole.trackId, v2)).toBe("cleared");
    expect(await statusOf(patientId, inPart.trackId, v2)).toBe("regressed");
  });

  it("counts a partly reached lesion as treated when the clinician says so", async () => {
    const patientId = (await makePatient(siteId)).id;
    const v1 = await visit(patientId, "2025-01-10");
    const inPart = await lesion(v1, hsil(3, 6));
    expect((await treat(v1, { modality: "electrocautery", lesionId: null, arcs: [{ startH: 4, endH: 8 }], partialCover: [{ lesionId: inPart.id, treated: true }] })).status).toBe(201);
    const [t] = await db.select().from(treatments).where(eq(treatments.visitId, v1));
    expect(t!.treatedLesionIds).toEqual([inPart.id]);
  });
});
