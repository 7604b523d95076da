// The visit report PDF: guarded, audited, and its text carries the findings.
import { beforeAll, describe, expect, it } from "vitest";
import { and, count, eq } from "drizzle-orm";
import { PDFParse } from "pdf-parse";
import { db } from "@/db/client";
import * as s from "@/db/schema";
import { GET as reportRoute } from "@/app/api/visits/[visitId]/report/route";
import { actor, ctx, makePatient, makeSite, ORIGIN, type Actor } from "../fixtures/factory";

let siteA: string, visitId: string;
let clinician: Actor, reviewer: Actor, nurse: Actor, otherClinician: Actor;

function get(who: Actor, path: string) {
  return new Request(`${ORIGIN}${path}`, { headers: { cookie: who.cookie, host: "dentate.test" } });
}

async function pdfText(res: Response): Promise<string> {
  const parser = new PDFParse({ data: new Uint8Array(await res.arrayBuffer()) });
  try {
    return (await parser.getText()).text;
  } finally {
    await parser.destroy();
  }
}

beforeAll(async () => {
  siteA = (await makeSite("A")).id;
  const siteB = (await makeSite("B")).id;
  clinician = await actor("clinician", [siteA]);
  reviewer = await actor("reviewer", [siteA]);
  nurse = await actor("research_nurse", [siteA]);
  otherClinician = await actor("clinician", [siteB]);
  const patient = await makePatient(siteA, { familyName: "Inventedname" });
  const [v] = await db
    .insert(s.visits)
    .values({
      patientId: patient.id, siteId: siteA, visitDate: "2026-03-02", examinerId: clinician.userId, cytology: "hsil", hpvResult: "hr_positive_16",
      adequacy: "scj_full", patientWeightKg: 70, plan: "Repeat exam in 6 months.", status: "signed", signedAt: new Date("2026-03-02T11:00:00Z"), signedBy: clinician.userId,
    })
    .returning({ id: s.visits.id });
  visitId = v!.id;
  const [l1, l2] = await db
    .insert(s.lesions)
    .values([
      { visitId, siteId: siteA, label: "L1", clockStartH: 1, clockEndH: 3, distanceStartCm: 1, distanceEndCm: 2, zone: "transformation_zone", grade: "lsil" },
      { visitId, siteId: siteA, label: "L2", clockStartH: 7, clockEndH: 8, distanceStartCm: 0, distanceEndCm: 1, zone: "distal_canal", grade: "condyloma" },
    ])
    .returning({ id: s.lesions.id });
  await db.insert(s.biopsies).values([
    { visitId, siteId: siteA, lesionId: l1!.id, specimenLabel: "A", clockH: 2, distanceCm: 1.5, histology: "hsil", ainGrade: "ain3" },
    { visitId, siteId: siteA, lesionId: l2!.id, specimenLabel: "B", clockH: 7.5, distanceCm: 0.5 },
  ]);
  await db.insert(s.treatments).values({ visitId, siteId: siteA, lesionId: l1!.id, modality: "infrared_coagulation", arcs: [{ startH: 1, endH: 3 }], treatedFraction: 2 / 12 });
  // 2 % lidocaine × 5 mL = 100 mg; 0.5 % bupivacaine × 10 mL = 50 mg (mg = % × 10 × mL, product labels).
  await db.insert(s.anaestheticDoses).values([
    { visitId, siteId: siteA, agent: "lidocaine", concentrationPct: 2, volumeMl: 5, withEpinephrine: true, doseMg: 100 },
    { visitId, siteId: siteA, agent: "bupivacaine", concentrationPct: 0.5, volumeMl: 10, withEpinephrine: false, doseMg: 50 },
  ]);
  await db.insert(s.addenda).values({ visitId, siteId: siteA, authorId: clinician.userId, body: "Histology for specimen A reviewed with the patient." });
});

describe("the visit report PDF", () => {
  it("holds the findings: grade words, specimen labels, modality, dose figures, addendum and signature", async () => {
    const res = await reportRoute(get(reviewer, `/api/visits/${visitId}/report`), ctx({ visitId }));
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toBe("application/pdf");
    const text = await pdfText(res);
    expect(text).toContain("Findings");
    expect(text).toContain("LSIL"); // impression grade (LAST two-tier terms, Darragh 2012)
    expect(text).toContain("HSIL"); // histology of specimen A
    expect(text).toContain("AIN3"); // older grade beside the LAST term (Darragh 2012)
    expect(text).toContain("Condyloma");
    expect(text).toMatch(/\bA\b[\s\S]*\bB\b/); // specimen labels in order
    expect(text).toContain("Awaiting result"); // specimen B has no histology yet
    expect(text).toContain("Infrared coagulation");
    expect(text).toContain("100 mg"); // 2 % × 10 × 5 mL
    expect(text).toContain("50 mg"); // 0.5 % × 10 × 10 mL
    // Lidocaine with epinephrine: 7 mg/kg × 70 kg = 490 mg, under the 500 mg label ceiling (lidocaine product label).
    expect(text).toContain("490 mg maximum");
    // Bupivacaine plain: 175 mg label ceiling; 2.5 mg/kg × 70 = 175 mg (secondary sources).
    expect(text).toContain("175 mg maximum");
    // 1 to 3 o'clock is 2 of 12 clock hours = 17% of the circumference.
    expect(text).toContain("Treated 17% of the circumference");
    expect(text).toContain("Histology for specimen A reviewed with the patient.");
    expect(text).toContain("Signed by");
    expect(text).not.toContain("DRAFT");
  });

  it("prints on Letter when asked, and refuses an unknown paper size with 400", async () => {
    const res = await reportRoute(get(clinician, `/api/visits/${visitId}/report?paper=letter`), ctx({ visitId }));
    expect(res.status).toBe(200);
    // US Letter is 8.5 × 11 in = 612 × 792 pt (ANSI/ASME Y14.1).
    expect(Buffer.from(await res.arrayBuffer()).toString("latin1")).toContain("/MediaBox [0 0 612 792]");
    const bad = await reportRoute(get(clinician, `/api/visits/${visitId}/report?paper=tabloid`), ctx({ visitId }));
    expect(bad.status).toBe(400);
  });

  it("is refused to a research nurse (403) and to another site (404), and every download is audited", async () => {
    expect((await reportRoute(get(nurse, `/api/visits/${visitId}/report`), ctx({ visitId }))).status).toBe(403);
    expect((await reportRoute(get(otherClinician, `/api/visits/${visitId}/report`), ctx({ visitId }))).status).toBe(404);
    const [r] = await db
      .select({ n: count() })
      .from(s.auditEvents)
      .where(and(eq(s.auditEvents.entityId, visitId), eq(s.auditEvents.action, "visit.report")));
    expect(r!.n).toBe(2);
  });
});
