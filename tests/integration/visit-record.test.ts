import { beforeAll, describe, expect, it } from "vitest";
import { and, count, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { anaestheticDoses, auditEvents, complications, lesions, treatments, visitDiagnoses, visits } from "@/db/schema";
import { GET as getVisit, PATCH as patchVisit } from "@/app/api/visits/[visitId]/route";
import { POST as addTreatment } from "@/app/api/visits/[visitId]/treatments/route";
import { DELETE as deleteTreatment } from "@/app/api/visits/[visitId]/treatments/[treatmentId]/route";
import { GET as listDoses, POST as addDose } from "@/app/api/visits/[visitId]/anaesthetic/route";
import { POST as addComplication } from "@/app/api/visits/[visitId]/complications/route";
import { DELETE as unconfirm, GET as getDiagnoses, POST as confirm } from "@/app/api/visits/[visitId]/diagnoses/route";
import { actor, ctx, makePatient, makeSite, req, type Actor } from "../fixtures/factory";

let siteA: string, siteB: string, patientA: string;
let clinician: Actor, reviewer: Actor, nurse: Actor, otherSite: Actor;

beforeAll(async () => {
  siteA = (await makeSite("A")).id;
  siteB = (await makeSite("B")).id;
  patientA = (await makePatient(siteA)).id;
  clinician = await actor("clinician", [siteA]);
  reviewer = await actor("reviewer", [siteA]);
  nurse = await actor("research_nurse", [siteA]);
  otherSite = await actor("clinician", [siteB]);
});

async function makeVisit(weightKg: number | null = 70) {
  const [v] = await db.insert(visits).values({ patientId: patientA, siteId: siteA, visitDate: "2026-03-02", examinerId: clinician.userId, patientWeightKg: weightKg }).returning({ id: visits.id });
  return v!.id;
}

async function rows(table: typeof treatments | typeof anaestheticDoses | typeof complications, visitId: string) {
  const [r] = await db.select({ n: count() }).from(table).where(eq(table.visitId, visitId));
  return r!.n;
}

const dosePath = (v: string) => `/api/visits/${v}/anaesthetic`;
const post = (handler: typeof addDose, path: string, who: Actor, visitId: string, body: unknown) => handler(req("POST", path, who, body), ctx({ visitId }));

describe("local anaesthetic entries: the server computes mg and guards the running total", () => {
  it("ignores a client doseMg and stores concentration % × 10 × mL", async () => {
    const visitId = await makeVisit();
    // 1 % = 10 mg/mL (product labels): 1 % × 5 mL = 50 mg, whatever the client claims.
    const res = await post(addDose, dosePath(visitId), clinician, visitId, { agent: "lidocaine", concentrationPct: 1, volumeMl: 5, withEpinephrine: false, doseMg: 1 });
    expect(res.status).toBe(201);
    const [row] = await db.select().from(anaestheticDoses).where(eq(anaestheticDoses.visitId, visitId));
    expect(row!.doseMg).toBeCloseTo(50, 9);
  });

  it("refuses (400, field message, nothing written) an entry over the lidocaine maximum, then accepts it with a reason and audits it", async () => {
    const visitId = await makeVisit(70);
    // Lidocaine label, plain: 4.5 mg/kg × 70 kg = 315 mg, capped at 300 mg (product labels). 2 % × 10 mL = 200 mg, then 1 % × 12 mL = 120 mg → 320 mg.
    expect((await post(addDose, dosePath(visitId), clinician, visitId, { agent: "lidocaine", concentrationPct: 2, volumeMl: 10, withEpinephrine: false })).status).toBe(201);
    const refused = await post(addDose, dosePath(visitId), clinician, visitId, { agent: "lidocaine", concentrationPct: 1, volumeMl: 12, withEpinephrine: false });
    expect(refused.status).toBe(400);
    const body = await refused.json();
    expect(body.error.fields.overrideReason[0]).toMatch(/300 mg/);
    expect(await rows(anaestheticDoses, visitId)).toBe(1);

    const accepted = await post(addDose, dosePath(visitId), clinician, visitId, { agent: "lidocaine", concentrationPct: 1, volumeMl: 12, withEpinephrine: false, overrideReason: "Anaesthetist present; agreed at huddle" });
    expect(accepted.status).toBe(201);
    const { id } = await accepted.json();
    const [row] = await db.select().from(anaestheticDoses).where(eq(anaestheticDoses.id, id));
    expect(row!.overrideReason).toBe("Anaesthetist present; agreed at huddle");
    expect(row!.overriddenBy).toBe(clinician.userId);
    const audits = await db.select().from(auditEvents).where(and(eq(auditEvents.entityId, id), eq(auditEvents.action, "anaesthetic.create.override")));
    expect(audits).toHaveLength(1);
    expect((audits[0]!.detail as { overrideReason: string }).overrideReason).toBe("Anaesthetist present; agreed at huddle");
  });

  it("counts bupivacaine over 24 hours across visits: 350 mg earlier today leaves room for 50 mg, not 75 mg", async () => {
    // Bupivacaine US product label: a total daily dose of 400 mg should not be exceeded (from memory;
    // DAILY_LIMIT_MG). Each session below stays under its own 225 mg ceiling with epinephrine.
    const patient = (await makePatient(siteA)).id;
    const visit = async () => {
      const [v] = await db.insert(visits).values({ patientId: patient, siteId: siteA, visitDate: "2026-03-02", examinerId: clinician.userId, patientWeightKg: 90 }).returning({ id: visits.id });
      return v!.id;
    };
    const bupi = (volumeMl: number, extra = {}) => ({ agent: "bupivacaine", concentrationPct: 0.5, volumeMl, withEpinephrine: true, ...extra });
    const first = await visit();
    expect((await post(addDose, dosePath(first), clinician, first, bupi(35))).status).toBe(201); // 175 mg
    const second = await visit();
    expect((await post(addDose, dosePath(second), clinician, second, bupi(35))).status).toBe(201); // 175 mg: 350 mg today
    const third = await visit();
    const refused = await post(addDose, dosePath(third), clinician, third, bupi(15)); // 75 mg: 425 mg in 24 h
    expect(refused.status).toBe(400);
    expect((await refused.json()).error.fields.overrideReason[0]).toMatch(/425 mg in 24 hours.*400 mg/);
    expect(await rows(anaestheticDoses, third)).toBe(0);
    expect((await post(addDose, dosePath(third), clinician, third, bupi(10))).status).toBe(201); // 50 mg: exactly 400 mg
  });

  it("uses the higher limit with epinephrine: 320 mg of lidocaine for 70 kg is within 7 mg/kg = 490 mg", async () => {
    const visitId = await makeVisit(70);
    // Lidocaine label with epinephrine: ≤ 7 mg/kg, not over 500 mg (product labels).
    expect((await post(addDose, dosePath(visitId), clinician, visitId, { agent: "lidocaine", concentrationPct: 2, volumeMl: 10, withEpinephrine: true })).status).toBe(201);
    expect((await post(addDose, dosePath(visitId), clinician, visitId, { agent: "lidocaine", concentrationPct: 1, volumeMl: 12, withEpinephrine: true })).status).toBe(201);
    const list = await (await listDoses(req("GET", dosePath(visitId), clinician), ctx({ visitId }))).json();
    expect(list.assessment.agents[0].maxMg).toBeCloseTo(490, 9);
    expect(list.assessment.agents[0].totalMg).toBeCloseTo(320, 9);
  });

  it("without a recorded weight only the label ceiling applies: bupivacaine 0.25 % × 70 mL = 175 mg is allowed, 1 mL more is not", async () => {
    const visitId = await makeVisit(null);
    // Bupivacaine label: up to 175 mg without epinephrine (product labels check value).
    expect((await post(addDose, dosePath(visitId), clinician, visitId, { agent: "bupivacaine", concentrationPct: 0.25, volumeMl: 70, withEpinephrine: false })).status).toBe(201);
    expect((await post(addDose, dosePath(visitId), clinician, visitId, { agent: "bupivacaine", concentrationPct: 0.25, volumeMl: 1, withEpinephrine: false })).status).toBe(400);
  });
});

describe("treatments: the treated union of the visit is recomputed by the server", () => {
  const tPath = (v: string) => `/api/visits/${v}/treatments`;

  it("asks for a reason when the visit's union reaches half the circumference, then stores and audits it", async () => {
    const visitId = await makeVisit();
    // Staged treatment for circumferential disease (Pineda CE et al., J Gastrointest Surg 2007); 50 % level from memory, the default.
    const first = await post(addTreatment, tPath(visitId), clinician, visitId, { modality: "infrared_coagulation", arcs: [{ startH: 11, endH: 2 }], treatedFraction: 0 });
    expect(first.status).toBe(201);
    expect((await first.json()).extent.fraction).toBeCloseTo(3 / 12, 9);
    // 11→2 plus 2→5 = 6 of 12 hours = exactly half.
    const refused = await post(addTreatment, tPath(visitId), clinician, visitId, { modality: "electrocautery", arcs: [{ startH: 2, endH: 5 }] });
    expect(refused.status).toBe(400);
    expect(Object.keys((await refused.json()).error.fields)).toEqual(["extentOverrideReason"]);
    expect(await rows(treatments, visitId)).toBe(1);

    const ok = await post(addTreatment, tPath(visitId), clinician, visitId, { modality: "electrocautery", arcs: [{ startH: 2, endH: 5 }], extentOverrideReason: "Single session agreed with patient" });
    expect(ok.status).toBe(201);
    const body = await ok.json();
    expect(body.caution).toMatch(/50%/);
    const stored = await db.select().from(treatments).where(eq(treatments.visitId, visitId));
    expect(stored.every((t) => Math.abs(t.treatedFraction - 0.5) < 1e-9)).toBe(true);
    expect(stored.find((t) => t.id === body.id)!.extentOverrideReason).toBe("Single session agreed with patient");
    const audits = await db.select().from(auditEvents).where(and(eq(auditEvents.entityId, body.id), eq(auditEvents.action, "treatment.create")));
    expect((audits[0]!.detail as { extentOverrideReason: string }).extentOverrideReason).toBe("Single session agreed with patient");

    const del = await deleteTreatment(req("DELETE", `${tPath(visitId)}/${body.id}`, clinician), ctx({ visitId, treatmentId: body.id }));
    expect((await del.json()).extent.fraction).toBeCloseTo(0.25, 9);
  });

  it("rejects a lesion of another visit with a field message", async () => {
    const visitId = await makeVisit();
    const otherVisit = await makeVisit();
    const [l] = await db.insert(lesions).values({ visitId: otherVisit, siteId: siteA, label: "L1", clockStartH: 1, clockEndH: 2, distanceStartCm: 1, distanceEndCm: 2, zone: "distal_canal", grade: "hsil" }).returning({ id: lesions.id });
    const res = await post(addTreatment, tPath(visitId), clinician, visitId, { modality: "laser", lesionId: l!.id, arcs: [] });
    expect(res.status).toBe(400);
    expect((await res.json()).error.fields.lesionId).toBeTruthy();
  });

  it("answers 403 to a reviewer and a research nurse, and writes nothing", async () => {
    const visitId = await makeVisit();
    for (const who of [reviewer, nurse]) {
      const res = await post(addTreatment, tPath(visitId), who, visitId, { modality: "laser", arcs: [{ startH: 1, endH: 2 }] });
      expect(res.status).toBe(403);
    }
    expect(await rows(treatments, visitId)).toBe(0);
  });

  it("answers 404 for another site's visit on reads and writes", async () => {
    const visitId = await makeVisit();
    expect((await getVisit(req("GET", `/api/visits/${visitId}`, otherSite), ctx({ visitId }))).status).toBe(404);
    expect((await post(addTreatment, tPath(visitId), otherSite, visitId, { modality: "laser", arcs: [{ startH: 1, endH: 2 }] })).status).toBe(404);
    expect(await rows(treatments, visitId)).toBe(0);
  });

  it("answers 400 with field names for bad input and writes nothing", async () => {
    const visitId = await makeVisit();
    const res = await post(addTreatment, tPath(visitId), clinician, visitId, { modality: "freezing", arcs: [{ startH: 13, endH: 2 }] });
    expect(res.status).toBe(400);
    expect(Object.keys((await res.json()).error.fields)).toEqual(expect.arrayContaining(["modality", "arcs.0.startH"]));
    const dose = await post(addDose, dosePath(visitId), clinician, visitId, { agent: "lidocaine", concentrationPct: "1", volumeMl: -2 });
    expect(Object.keys((await dose.json()).error.fields)).toEqual(expect.arrayContaining(["concentrationPct", "volumeMl", "withEpinephrine"]));
    expect(await rows(treatments, visitId)).toBe(0);
    expect(await rows(anaestheticDoses, visitId)).toBe(0);
  });
});

describe("exam details and complications", () => {
  it("saves exam details with the version, refuses a stale version (409) and an end before the start (400)", async () => {
    const visitId = await makeVisit();
    const path = `/api/visits/${visitId}`;
    const fields = { visitDate: "2026-03-02", patientPosition: "prone_jackknife", cytology: "hsil", hpvResult: "hr_positive_16", adequacy: "scj_full", examStartedAt: "2026-03-02T09:00:00Z", examEndedAt: "2026-03-02T09:12:00Z", patientWeightKg: 64, plan: "Review in 6 months" };
    const ok = await patchVisit(req("PATCH", path, clinician, { ...fields, version: 1 }), ctx({ visitId }));
    expect(ok.status).toBe(200);
    expect((await ok.json()).visit).toMatchObject({ cytology: "hsil", patientWeightKg: 64, version: 2 });
    expect((await patchVisit(req("PATCH", path, clinician, { ...fields, version: 1 }), ctx({ visitId }))).status).toBe(409);
    const bad = await patchVisit(req("PATCH", path, clinician, { ...fields, examEndedAt: "2026-03-02T08:00:00Z", version: 2 }), ctx({ visitId }));
    expect(Object.keys((await bad.json()).error.fields)).toEqual(["examEndedAt"]);
  });

  it("records a complication and answers 400 to an unknown kind", async () => {
    const visitId = await makeVisit();
    const path = `/api/visits/${visitId}/complications`;
    expect((await post(addComplication, path, clinician, visitId, { kind: "bleeding", severity: "mild", timing: "during" })).status).toBe(201);
    expect((await post(addComplication, path, clinician, visitId, { kind: "fainting", severity: "mild", timing: "during" })).status).toBe(400);
    expect(await rows(complications, visitId)).toBe(1);
  });
});

describe("ICD-10-CM confirmation", () => {
  it("suggests from the visit's cytology and HPV, confirms only suggested codes, and un-confirms", async () => {
    const visitId = await makeVisit();
    await db.update(visits).set({ cytology: "lsil", hpvResult: "hr_positive_other" }).where(eq(visits.id, visitId));
    const path = `/api/visits/${visitId}/diagnoses`;
    const g = await (await getDiagnoses(req("GET", path, clinician), ctx({ visitId }))).json();
    // CMS ICD-10-CM: R85.612 LSIL on cytologic smear of anus; R85.81 anal high-risk HPV DNA positive (CMS ICD-10-CM).
    expect(g.suggestions.map((s: { code: string }) => s.code).sort()).toEqual(["R85.612", "R85.81"]);
    expect((await post(confirm, path, clinician, visitId, { code: "D01.3" })).status).toBe(400);
    expect((await post(confirm, path, clinician, visitId, { code: "R85.612" })).status).toBe(201);
    const [row] = await db.select().from(visitDiagnoses).where(eq(visitDiagnoses.visitId, visitId));
    expect(row!.descriptor).toBe("Low grade squamous intraepithelial lesion on cytologic smear of anus (LGSIL)");
    expect((await unconfirm(req("DELETE", `${path}?code=R85.612`, clinician), ctx({ visitId }))).status).toBe(200);
    expect(await db.select().from(visitDiagnoses).where(eq(visitDiagnoses.visitId, visitId))).toHaveLength(0);
  });
});
