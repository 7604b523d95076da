import { beforeAll, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { auditEvents, biopsies, lesions, treatments, visits } from "@/db/schema";
import type { Grade } from "@/lib/domain/vocab";
import { POST as addTreatment } from "@/app/api/visits/[visitId]/treatments/route";
import { actor, ctx, makePatient, makeSite, req, type Actor } from "../fixtures/factory";

// Ablating a lesion suspected or proven to be cancer destroys the tissue that diagnosis and staging
// need and can delay referral (common practice, no source): the server wants a recorded reason.

let siteA: string, patientA: string;
let clinician: Actor;

beforeAll(async () => {
  siteA = (await makeSite("A")).id;
  patientA = (await makePatient(siteA)).id;
  clinician = await actor("clinician", [siteA]);
});

async function visitWithLesion(grade: Grade, histology: "scc" | "hsil" | null = null) {
  const [v] = await db.insert(visits).values({ patientId: patientA, siteId: siteA, visitDate: "2026-03-02", examinerId: clinician.userId }).returning({ id: visits.id });
  const [l] = await db.insert(lesions).values({ visitId: v!.id, siteId: siteA, label: "L1", clockStartH: 1, clockEndH: 3, distanceStartCm: 1, distanceEndCm: 2, zone: "distal_canal", grade }).returning({ id: lesions.id });
  if (histology) await db.insert(biopsies).values({ visitId: v!.id, siteId: siteA, specimenLabel: "A", lesionId: l!.id, clockH: 2, distanceCm: 1.5, histology });
  return { visitId: v!.id, lesionId: l!.id };
}

const post = (visitId: string, body: unknown) => addTreatment(req("POST", `/api/visits/${visitId}/treatments`, clinician, body), ctx({ visitId }));
const stored = (visitId: string) => db.select().from(treatments).where(eq(treatments.visitId, visitId));

describe("treating a lesion that may be cancer needs a recorded reason", () => {
  it("refuses ablation of a lesion graded suspected cancer without a reason, then stores and audits the reason", async () => {
    const { visitId, lesionId } = await visitWithLesion("suspected_cancer");
    const refused = await post(visitId, { modality: "electrocautery", lesionId, arcs: [{ startH: 1, endH: 3 }] });
    expect(refused.status).toBe(400);
    const fields = (await refused.json()).error.fields;
    expect(Object.keys(fields)).toEqual(["cancerOverrideReason"]);
    expect(fields.cancerOverrideReason[0]).toMatch(/L1 is graded suspected cancer/);
    expect(await stored(visitId)).toHaveLength(0);

    const ok = await post(visitId, { modality: "electrocautery", lesionId, arcs: [{ startH: 1, endH: 3 }], cancerOverrideReason: "Symptomatic bleeding; biopsy taken first, referral sent" });
    expect(ok.status).toBe(201);
    const [t] = await stored(visitId);
    expect(t!.cancerOverrideReason).toBe("Symptomatic bleeding; biopsy taken first, referral sent");
    const [a] = await db.select().from(auditEvents).where(and(eq(auditEvents.entityId, t!.id), eq(auditEvents.action, "treatment.create")));
    expect((a!.detail as { cancerOverrideReason: string }).cancerOverrideReason).toBe("Symptomatic bleeding; biopsy taken first, referral sent");
  });

  it("catches carcinoma on histology when the treatment is entered as an arc that overlaps the lesion", async () => {
    // Impression LSIL, histology squamous cell carcinoma: histology decides (LAST, Darragh 2012).
    const { visitId } = await visitWithLesion("lsil", "scc");
    const refused = await post(visitId, { modality: "infrared_coagulation", arcs: [{ startH: 2, endH: 4 }] });
    expect(refused.status).toBe(400);
    expect((await refused.json()).error.fields.cancerOverrideReason[0]).toMatch(/squamous cell carcinoma on histology/);
    expect(await stored(visitId)).toHaveLength(0);
  });

  it("asks nothing for an arc that only touches the lesion's edge, for a topical agent, or for HSIL", async () => {
    const a = await visitWithLesion("suspected_cancer");
    expect((await post(a.visitId, { modality: "laser", arcs: [{ startH: 3, endH: 5 }] })).status).toBe(201);
    expect((await post(a.visitId, { modality: "topical_imiquimod", regimen: "As prescribed", lesionId: a.lesionId, arcs: [] })).status).toBe(201);
    const b = await visitWithLesion("hsil", "hsil");
    expect((await post(b.visitId, { modality: "electrocautery", lesionId: b.lesionId, arcs: [] })).status).toBe(201);
  });
});
