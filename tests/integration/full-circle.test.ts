import { beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import { lesions, treatments, visits } from "@/db/schema";
import { GET as visitLesions, POST as createLesion } from "@/app/api/visits/[visitId]/lesions/route";
import { PATCH as updateLesion } from "@/app/api/visits/[visitId]/lesions/[lesionId]/route";
import { GET as listTreatments, POST as addTreatment } from "@/app/api/visits/[visitId]/treatments/route";
import { actor, ctx, makePatient, makeSite, req, type Actor } from "../fixtures/factory";

// A circumferential lesion and a circumferential treatment are written 0 → 12 and read back as the
// whole circumference: 12 clock hours = 360° = 100 % (geometry). The caution level of half the
// circumference per session is from memory, unverified (staged treatment for circumferential
// disease: Pineda CE et al., J Gastrointest Surg 2007).

let siteId: string, patientId: string;
let clinician: Actor;

beforeAll(async () => {
  siteId = (await makeSite()).id;
  patientId = (await makePatient(siteId)).id;
  clinician = await actor("clinician", [siteId]);
});

async function visit() {
  const [v] = await db.insert(visits).values({ patientId, siteId, visitDate: "2026-02-02", examinerId: clinician.userId }).returning({ id: visits.id });
  return v!.id;
}
const ring = { clockStartH: 0, clockEndH: 12, distanceStartCm: 0.5, distanceEndCm: 1.5, grade: "hsil" };
const post = (visitId: string, body: unknown) => addTreatment(req("POST", `/api/visits/${visitId}/treatments`, clinician, body), ctx({ visitId }));

describe("the whole circumference through the API", () => {
  it("stores a circumferential lesion 0 → 12 and a circumferential treatment that reads 100 %", async () => {
    const visitId = await visit();
    const made = await createLesion(req("POST", "/x", clinician, ring), ctx({ visitId }));
    expect(made.status).toBe(201);
    const lesion = (await made.json()).lesion;
    const map = await (await visitLesions(req("GET", "/x", clinician), ctx({ visitId }))).json();
    expect(map.lesions[0]).toMatchObject({ clockStartH: 0, clockEndH: 12 });

    // 100 % reaches the caution level: refused without a reason, nothing stored.
    const refused = await post(visitId, { modality: "electrocautery", lesionId: null, arcs: [{ startH: 0, endH: 12 }] });
    expect(refused.status).toBe(400);
    expect(Object.keys((await refused.json()).error.fields)).toEqual(["extentOverrideReason"]);
    expect(await db.select().from(treatments).where(eq(treatments.visitId, visitId))).toHaveLength(0);

    const saved = await post(visitId, { modality: "electrocautery", lesionId: null, arcs: [{ startH: 0, endH: 12 }], extentOverrideReason: "Single planned session" });
    expect(saved.status).toBe(201);
    expect((await saved.json()).extent.fraction).toBe(1);
    const listed = await (await listTreatments(req("GET", "/x", clinician), ctx({ visitId }))).json();
    expect(listed.treatments[0].arcs).toEqual([{ startH: 0, endH: 12 }]);
    expect(listed.treatments[0].treatedFraction).toBe(1);
    expect(listed.extent.fraction).toBe(1);
    // The whole circumference covers the ring lesion fully: it is treated.
    expect(listed.treatments[0].treatedLesionIds).toEqual([lesion.id]);
  });

  it("refuses 12 as an end after a start other than 0 (400 with the field), on create and on update", async () => {
    const visitId = await visit();
    const bad = await createLesion(req("POST", "/x", clinician, { ...ring, clockStartH: 3 }), ctx({ visitId }));
    expect(bad.status).toBe(400);
    expect((await bad.json()).error.fields.clockEndH).toBeTruthy();
    const badArc = await post(visitId, { modality: "electrocautery", arcs: [{ startH: 3, endH: 12 }] });
    expect(badArc.status).toBe(400);

    const lesion = (await (await createLesion(req("POST", "/x", clinician, ring), ctx({ visitId }))).json()).lesion;
    // Only the start sent: stored with the end of 12 it would be neither a ring nor an arc.
    const moved = await updateLesion(req("PATCH", "/x", clinician, { version: lesion.version, clockStartH: 3 }), ctx({ visitId, lesionId: lesion.id }));
    expect(moved.status).toBe(400);
    expect((await moved.json()).error.fields.clockEndH).toBeTruthy();
    const [row] = await db.select().from(lesions).where(eq(lesions.id, lesion.id));
    expect([row!.clockStartH, row!.clockEndH]).toEqual([0, 12]);
  });
});
