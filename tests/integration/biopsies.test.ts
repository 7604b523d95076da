import { beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import { biopsies, trackStatuses, visits } from "@/db/schema";
import { POST as createLesion } from "@/app/api/visits/[visitId]/lesions/route";
import { POST as createBiopsy } from "@/app/api/visits/[visitId]/biopsies/route";
import { PATCH as enterResult } from "@/app/api/biopsies/[biopsyId]/route";
import { GET as awaiting } from "@/app/api/biopsies/awaiting/route";
import { POST as sign } from "@/app/api/visits/[visitId]/sign/route";
import { actor, ctx, makePatient, makeSite, req, type Actor } from "../fixtures/factory";

let siteId: string, patientId: string, visitId: string;
let clinician: Actor, reviewer: Actor, other: Actor;

beforeAll(async () => {
  siteId = (await makeSite()).id;
  clinician = await actor("clinician", [siteId]);
  reviewer = await actor("reviewer", [siteId]);
  other = await actor("clinician", [(await makeSite()).id]);
  patientId = (await makePatient(siteId)).id;
  const [v] = await db.insert(visits).values({ patientId, siteId, visitDate: "2026-04-02", examinerId: clinician.userId }).returning();
  visitId = v!.id;
});

describe("biopsies and histology", () => {
  it("labels specimens A, B… per visit, from a lesion or from a clock position", async () => {
    const { lesion } = await (await createLesion(req("POST", "/x", clinician, { clockStartH: 2, clockEndH: 4, distanceStartCm: 0.5, distanceEndCm: 1.5, grade: "lsil" }), ctx({ visitId }))).json();
    const a = await (await createBiopsy(req("POST", "/x", clinician, { lesionId: lesion.id }), ctx({ visitId }))).json();
    const b = await (await createBiopsy(req("POST", "/x", clinician, { clockH: 7, distanceCm: 1 }), ctx({ visitId }))).json();
    expect(a.biopsy.specimenLabel).toBe("A");
    expect(b.biopsy.specimenLabel).toBe("B");
    expect(a.biopsy.lesionId).toBe(lesion.id);
    // A specimen from a lesion sits at the lesion's middle for both clock and depth: 2→4 o'clock
    // has its middle at 3 o'clock (30° per hour, geometry), 0.5–1.5 cm at 1 cm.
    expect(a.biopsy.clockH).toBeCloseTo(3, 9);
    expect(a.biopsy.distanceCm).toBeCloseTo(1, 9);
  });

  it("places a specimen from a lesion that crosses 12 o'clock at the lesion's middle, 12 o'clock", async () => {
    // 11 → 1 o'clock runs clockwise through 12 (geometry); its middle is 12, stored as 0.
    const { lesion } = await (await createLesion(req("POST", "/x", clinician, { clockStartH: 11, clockEndH: 1, distanceStartCm: 1, distanceEndCm: 2, grade: "lsil" }), ctx({ visitId }))).json();
    const { biopsy } = await (await createBiopsy(req("POST", "/x", clinician, { lesionId: lesion.id }), ctx({ visitId }))).json();
    expect(biopsy.clockH % 12).toBeCloseTo(0, 9);
    expect(biopsy.distanceCm).toBeCloseTo(1.5, 9);
  });

  it("histology entered later re-grades the lesion for tracking (histology decides), even after signing", async () => {
    const { lesion } = await (await createLesion(req("POST", "/x", clinician, { clockStartH: 8, clockEndH: 9, distanceStartCm: 1, distanceEndCm: 2, grade: "lsil" }), ctx({ visitId }))).json();
    const { biopsy } = await (await createBiopsy(req("POST", "/x", clinician, { lesionId: lesion.id }), ctx({ visitId }))).json();
    // A draft drives no status; signing gives the track its first one.
    expect(await db.select().from(trackStatuses).where(eq(trackStatuses.trackId, lesion.trackId))).toEqual([]);
    // The result comes back after the visit was signed.
    expect((await sign(req("POST", "/x", clinician), ctx({ visitId }))).status).toBe(200);
    const before = await db.select().from(trackStatuses).where(eq(trackStatuses.trackId, lesion.trackId));
    expect(before[0]!.effectiveGrade).toBe("lsil");
    const list = await (await awaiting(req("GET", "/x", clinician))).json();
    expect(list.biopsies.map((x: { id: string }) => x.id)).toContain(biopsy.id);
    // LAST (Darragh 2012): AIN2 with block-positive p16 is HSIL.
    const res = await enterResult(req("PATCH", "/x", clinician, { histology: "hsil", ainGrade: "ain2", p16: "block_positive" }), ctx({ biopsyId: biopsy.id }));
    expect(res.status).toBe(200);
    const after = await db.select().from(trackStatuses).where(eq(trackStatuses.trackId, lesion.trackId));
    expect(after[0]!.effectiveGrade).toBe("hsil");
    expect(after[0]!.reason).toMatch(/histology/i);
    const list2 = await (await awaiting(req("GET", "/x", clinician))).json();
    expect(list2.biopsies.map((x: { id: string }) => x.id)).not.toContain(biopsy.id);
    // New specimens cannot be added to a signed visit.
    expect((await createBiopsy(req("POST", "/x", clinician, { clockH: 1, distanceCm: 1 }), ctx({ visitId }))).status).toBe(423);
  });

  it("refuses results from a reviewer (403) and from another site (404); bad results are 400", async () => {
    const [b] = await db.select().from(biopsies).where(eq(biopsies.visitId, visitId)).limit(1);
    expect((await enterResult(req("PATCH", "/x", reviewer, { histology: "benign" }), ctx({ biopsyId: b!.id }))).status).toBe(403);
    expect((await enterResult(req("PATCH", "/x", other, { histology: "benign" }), ctx({ biopsyId: b!.id }))).status).toBe(404);
    const bad = await enterResult(req("PATCH", "/x", clinician, { histology: "AIN3" }), ctx({ biopsyId: b!.id }));
    expect(bad.status).toBe(400);
    expect((await bad.json()).error.fields.histology).toBeDefined();
  });
});
