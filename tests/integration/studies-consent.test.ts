// Studies set up by administrators and research nurses at their own sites; research consent
// recorded and withdrawn by clinicians and administrators; enrolment offers only patients with a
// current consent to that study. Every change is audited; bad input is a 400 and writes nothing.
import { randomUUID } from "node:crypto";
import { and, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { auditEvents } from "@/db/schema";
import { patientReference } from "@/db/queries/research/enrolment";
import { POST as createStudy } from "@/app/api/studies/route";
import { GET as getStudy, PATCH as editStudy } from "@/app/api/studies/[studyId]/route";
import { POST as recordConsent } from "@/app/api/patients/[patientId]/consents/route";
import { PATCH as withdrawConsent } from "@/app/api/patients/[patientId]/consents/[consentId]/route";
import { actor, ctx, makePatient, makeSite, req, type Actor } from "../fixtures/factory";
import { tableChecksums } from "../support/db-checksum";

let siteA: string, siteB: string, nurse: Actor, admin: Actor, clinician: Actor, reviewer: Actor, nurseB: Actor;
const code = () => `ST-${randomUUID().slice(0, 6).toUpperCase()}`;
const auditOf = async (action: string, entityId: string) => (await db.select().from(auditEvents).where(and(eq(auditEvents.action, action), eq(auditEvents.entityId, entityId))))[0];

beforeAll(async () => {
  siteA = (await makeSite("Consent")).id;
  siteB = (await makeSite("Other")).id;
  [nurse, admin, clinician, reviewer] = await Promise.all([actor("research_nurse", [siteA]), actor("admin", [siteA]), actor("clinician", [siteA]), actor("reviewer", [siteA])]);
  nurseB = await actor("research_nurse", [siteB]);
});

async function newStudy(who = nurse, overrides: Record<string, unknown> = {}) {
  const body = { code: code(), title: "Invented surveillance study", siteIds: [siteA], startDate: "2025-01-06", consentFormVersion: "2.1", ...overrides };
  return createStudy(req("POST", "/api/studies", who, body), ctx({}));
}

describe("studies", () => {
  it("a research nurse or an administrator sets one up; it is audited; others may not", async () => {
    const res = await newStudy();
    expect(res.status).toBe(201);
    const { study } = await res.json();
    expect(study).toMatchObject({ title: "Invented surveillance study", consentFormVersion: "2.1" });
    expect((await auditOf("study.create", study.id))!.userId).toBe(nurse.userId);
    expect((await newStudy(admin)).status).toBe(201);
    expect((await newStudy(clinician)).status).toBe(403);
    const seen = await getStudy(req("GET", `/api/studies/${study.id}`, nurse), ctx({ studyId: study.id }));
    expect((await seen.json()).study.consentFormVersion).toBe("2.1");
  });

  it("refuses a taken code (409), another site (400) and a bad date (400), writing nothing", async () => {
    const taken = (await (await newStudy()).json()).study.code;
    const before = await tableChecksums();
    expect((await newStudy(nurse, { code: taken })).status).toBe(409);
    expect((await newStudy(nurse, { siteIds: [siteB] })).status).toBe(400);
    const bad = await newStudy(nurse, { startDate: "2025-02-30" });
    expect(bad.status).toBe(400);
    expect(Object.keys((await bad.json()).error.fields)).toContain("startDate");
    expect((await tableChecksums())["studies"]).toBe(before["studies"]);
  });

  it("is edited by staff of its sites only, with before and after in the audit trail", async () => {
    const { study } = await (await newStudy()).json();
    const url = `/api/studies/${study.id}`;
    expect((await editStudy(req("PATCH", url, nurseB, { title: "Changed" }), ctx({ studyId: study.id }))).status).toBe(404);
    const ok = await editStudy(req("PATCH", url, admin, { title: "Renamed surveillance study", consentFormVersion: "3.0" }), ctx({ studyId: study.id }));
    expect(ok.status).toBe(200);
    const detail = (await auditOf("study.update", study.id))!.detail as { before: { title: string; consentFormVersion: string }; after: { title: string; consentFormVersion: string } };
    expect(detail.before).toMatchObject({ title: "Invented surveillance study", consentFormVersion: "2.1" });
    expect(detail.after).toMatchObject({ title: "Renamed surveillance study", consentFormVersion: "3.0" });
  });
});

describe("research consent and enrolment", () => {
  it("only a patient with a current consent to the study is offered for enrolment", async () => {
    const { study } = await (await newStudy()).json();
    const p = await makePatient(siteA, { consentResearch: true });
    const candidates = async () =>
      (await (await getStudy(req("GET", `/api/studies/${study.id}`, nurse), ctx({ studyId: study.id }))).json()).candidates.map((c: { ref: string }) => c.ref);
    expect(await candidates()).not.toContain(patientReference(p.id));

    const url = `/api/patients/${p.id}/consents`;
    expect((await recordConsent(req("POST", url, reviewer, { studyId: study.id, consentedOn: "2025-03-03" }), ctx({ patientId: p.id }))).status).toBe(403);
    expect((await recordConsent(req("POST", url, nurse, { studyId: study.id, consentedOn: "2025-03-03" }), ctx({ patientId: p.id }))).status).toBe(403);
    expect((await recordConsent(req("POST", url, clinician, { studyId: study.id, consentedOn: "2999-01-01" }), ctx({ patientId: p.id }))).status).toBe(400);
    const made = await recordConsent(req("POST", url, clinician, { studyId: study.id, consentedOn: "2025-03-03" }), ctx({ patientId: p.id }));
    expect(made.status).toBe(201);
    const { consent } = await made.json();
    expect(consent.formVersion).toBe("2.1");
    expect((await auditOf("consent.record", consent.id))!.patientId).toBe(p.id);
    expect(await candidates()).toContain(patientReference(p.id));
    expect((await recordConsent(req("POST", url, clinician, { studyId: study.id, consentedOn: "2025-03-04" }), ctx({ patientId: p.id }))).status).toBe(409);

    const wurl = `/api/patients/${p.id}/consents/${consent.id}`;
    expect((await withdrawConsent(req("PATCH", wurl, clinician, { withdrawnOn: "2025-03-01" }), ctx({ patientId: p.id, consentId: consent.id }))).status).toBe(400);
    expect((await withdrawConsent(req("PATCH", wurl, admin, { withdrawnOn: "2025-04-01" }), ctx({ patientId: p.id, consentId: consent.id }))).status).toBe(200);
    expect((await auditOf("consent.withdraw", consent.id))!.userId).toBe(admin.userId);
    expect(await candidates()).not.toContain(patientReference(p.id));
    expect((await withdrawConsent(req("PATCH", wurl, admin, { withdrawnOn: "2025-04-02" }), ctx({ patientId: p.id, consentId: consent.id }))).status).toBe(409);
  });

  it("refuses a study that does not run at the patient's site, and another site's patient", async () => {
    const { study } = await (await newStudy()).json();
    const elsewhere = await makePatient(siteB);
    const here = await makePatient(siteA);
    const otherStudy = (await (await newStudy(nurseB, { siteIds: [siteB] })).json()).study;
    expect((await recordConsent(req("POST", `/api/patients/${elsewhere.id}/consents`, clinician, { studyId: study.id, consentedOn: "2025-03-03" }), ctx({ patientId: elsewhere.id }))).status).toBe(404);
    const wrong = await recordConsent(req("POST", `/api/patients/${here.id}/consents`, clinician, { studyId: otherStudy.id, consentedOn: "2025-03-03" }), ctx({ patientId: here.id }));
    expect(wrong.status).toBe(400);
    expect((await wrong.json()).error.fields.studyId[0]).toMatch(/does not run/);
  });
});
