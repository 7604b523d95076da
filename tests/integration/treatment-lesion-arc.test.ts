import { beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import { lesions, treatments, visits } from "@/db/schema";
import { POST as addTreatment } from "@/app/api/visits/[visitId]/treatments/route";
import { actor, ctx, makePatient, makeSite, req, type Actor } from "../fixtures/factory";

// A treatment that names a lesion but no arcs was given over the lesion's mapped extent; that
// extent must be stored and count toward the session's circumference check.

let siteA: string, patientA: string;
let clinician: Actor;

beforeAll(async () => {
  siteA = (await makeSite("A")).id;
  patientA = (await makePatient(siteA)).id;
  clinician = await actor("clinician", [siteA]);
});

async function visitWithLesion(clockStartH: number, clockEndH: number) {
  const [v] = await db.insert(visits).values({ patientId: patientA, siteId: siteA, visitDate: "2026-03-02", examinerId: clinician.userId }).returning({ id: visits.id });
  const [l] = await db.insert(lesions).values({ visitId: v!.id, siteId: siteA, label: "L1", clockStartH, clockEndH, distanceStartCm: 1, distanceEndCm: 2, zone: "distal_canal", grade: "hsil" }).returning({ id: lesions.id });
  return { visitId: v!.id, lesionId: l!.id };
}

const post = (visitId: string, body: unknown) => addTreatment(req("POST", `/api/visits/${visitId}/treatments`, clinician, body), ctx({ visitId }));

describe("a treatment naming a lesion without arcs uses the lesion's extent", () => {
  it("stores the lesion's arc and reports its share of the circumference, not 0 %", async () => {
    // 11 → 2 o'clock is 3 of 12 hours = 25 % of the circumference (30° per hour, geometry).
    const { visitId, lesionId } = await visitWithLesion(11, 2);
    const res = await post(visitId, { modality: "electrocautery", lesionId, arcs: [] });
    expect(res.status).toBe(201);
    expect((await res.json()).extent.fraction).toBeCloseTo(0.25, 9);
    const [t] = await db.select().from(treatments).where(eq(treatments.visitId, visitId));
    expect(t!.arcs).toEqual([{ startH: 11, endH: 2 }]);
    expect(t!.treatedFraction).toBeCloseTo(0.25, 9);
  });

  it("asks for the extent reason when the lesion alone reaches half the circumference", async () => {
    // 3 → 9 o'clock is 6 h = 50 %; the per-session caution level of half the circumference is
    // from memory (staged treatment: Pineda CE et al., J Gastrointest Surg 2007), the default.
    const { visitId, lesionId } = await visitWithLesion(3, 9);
    const refused = await post(visitId, { modality: "electrocautery", lesionId, arcs: [] });
    expect(refused.status).toBe(400);
    expect(Object.keys((await refused.json()).error.fields)).toEqual(["extentOverrideReason"]);
    expect(await db.select().from(treatments).where(eq(treatments.visitId, visitId))).toHaveLength(0);
  });

  it("keeps a topical agent without an arc (it treats no mapped arc)", async () => {
    const { visitId, lesionId } = await visitWithLesion(1, 2);
    const res = await post(visitId, { modality: "topical_imiquimod", regimen: "Three times a week for 16 weeks", lesionId, arcs: [] });
    expect(res.status).toBe(201);
    const [t] = await db.select().from(treatments).where(eq(treatments.visitId, visitId));
    expect(t!.arcs).toEqual([]);
  });
});
