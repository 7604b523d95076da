// Enrolment by opaque reference: the nurse never handles a name or an MRN.
import { beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import * as s from "@/db/schema";
import { patientReference } from "@/db/queries/research/enrolment";
import { GET as getStudy } from "@/app/api/studies/[studyId]/route";
import { POST as enrol } from "@/app/api/studies/[studyId]/enrolments/route";
import { PATCH as withdraw } from "@/app/api/studies/[studyId]/enrolments/[enrolmentId]/route";
import { actor, consentTo, ctx, makePatient, makeSite, req, type Actor } from "../fixtures/factory";

let siteA: string, studyId: string, consenting: { id: string; mrn: string; familyName: string }, refusing: string;
let nurse: Actor, clinician: Actor, nurseB: Actor;

beforeAll(async () => {
  siteA = (await makeSite("Enrol")).id;
  nurse = await actor("research_nurse", [siteA]);
  clinician = await actor("clinician", [siteA]);
  nurseB = await actor("research_nurse", [(await makeSite("Other")).id]);
  const [study] = await db.insert(s.studies).values({ code: `E-${siteA.slice(0, 6)}`, title: "Invented enrolment study", startDate: "2024-01-01" }).returning();
  studyId = study!.id;
  await db.insert(s.studySites).values({ studyId, siteId: siteA });
  const p = await makePatient(siteA, { consentResearch: true, familyName: "Thornquist" });
  consenting = { id: p.id, mrn: p.mrn, familyName: p.familyName };
  await consentTo(p.id, studyId, siteA);
  refusing = (await makePatient(siteA, { consentResearch: false })).id;
});

const path = () => `/api/studies/${studyId}/enrolments`;

describe("enrolment", () => {
  it("offers only consenting patients, by opaque reference, with no name or MRN", async () => {
    const res = await getStudy(req("GET", `/api/studies/${studyId}`, nurse), ctx({ studyId }));
    expect(res.status).toBe(200);
    const text = await res.text();
    for (const v of [consenting.mrn, consenting.familyName, consenting.id]) expect(text).not.toContain(v);
    const refs = JSON.parse(text).candidates.map((c: { ref: string }) => c.ref);
    expect(refs).toEqual([patientReference(consenting.id)]);
    expect(refs).not.toContain(patientReference(refusing));
  });

  it("refuses a study subject ID that is an MRN of the site, apart from case and hyphens (400, nothing written)", async () => {
    // A study ID travels into de-identified exports; an MRN there re-identifies the subject
    // (HIPAA Safe Harbor, 45 CFR 164.514(b)(2)(i)(H): medical record numbers are identifiers).
    const other = await makePatient(siteA, { consentResearch: false, mrn: `MRN-${siteA.slice(0, 4)}77` });
    for (const studySubjectId of [other.mrn, other.mrn.toLowerCase().replace(/-/g, "")]) {
      const body = { candidateRef: patientReference(consenting.id), siteId: siteA, studySubjectId, consentDate: "2025-02-01" };
      const res = await enrol(req("POST", path(), nurse, body), ctx({ studyId }));
      expect(res.status).toBe(400);
      expect(Object.keys((await res.json()).error.fields)).toEqual(["studySubjectId"]);
    }
    expect(await db.select().from(s.enrolments).where(eq(s.enrolments.patientId, consenting.id))).toEqual([]);
  });

  it("enrols by reference, refuses a taken study ID and a patient without consent", async () => {
    const body = { candidateRef: patientReference(consenting.id), siteId: siteA, studySubjectId: "ENR-001", consentDate: "2025-02-01" };
    expect((await enrol(req("POST", path(), clinician, body), ctx({ studyId }))).status).toBe(403);
    expect((await enrol(req("POST", path(), nurseB, body), ctx({ studyId }))).status).toBe(404);
    const res = await enrol(req("POST", path(), nurse, body), ctx({ studyId }));
    expect(res.status).toBe(201);
    expect((await enrol(req("POST", path(), nurse, { ...body, candidateRef: patientReference(refusing), studySubjectId: "ENR-002" }), ctx({ studyId }))).status).toBe(400);
    expect((await enrol(req("POST", path(), nurse, { ...body, studySubjectId: "ENR 001; drop" }), ctx({ studyId }))).status).toBe(400);
    const [row] = await db.select().from(s.enrolments).where(eq(s.enrolments.patientId, consenting.id));
    expect(row).toMatchObject({ studySubjectId: "ENR-001", consentDate: "2025-02-01", withdrawnOn: null });
  });

  it("records a withdrawal, never before consent", async () => {
    const [row] = await db.select().from(s.enrolments).where(eq(s.enrolments.patientId, consenting.id));
    const p = `${path()}/${row!.id}`;
    const c = ctx({ studyId, enrolmentId: row!.id });
    expect((await withdraw(req("PATCH", p, nurse, { withdrawnOn: "2025-01-31" }), c)).status).toBe(400);
    expect((await withdraw(req("PATCH", p, nurseB, { withdrawnOn: "2025-06-30" }), c)).status).toBe(404);
    expect((await withdraw(req("PATCH", p, nurse, { withdrawnOn: "2025-06-30" }), c)).status).toBe(200);
    const [after] = await db.select().from(s.enrolments).where(eq(s.enrolments.id, row!.id));
    expect(after!.withdrawnOn).toBe("2025-06-30");
  });
});
