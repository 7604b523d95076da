// Research exports end to end through the route handlers, on invented records.
// Safe Harbor (45 CFR 164.514(b)(2); 45 CFR 164.514(b)(2), HHS guidance): no names, MRNs, contact
// details, free text or full dates; ages over 89 as one category; restricted ZIP areas as 000.
import { inflateRawSync } from "node:zlib";
import { beforeAll, describe, expect, it } from "vitest";
import { parse } from "csv-parse/sync";
import ExcelJS from "exceljs";
import { and, desc, eq } from "drizzle-orm";
import { db } from "@/db/client";
import * as s from "@/db/schema";
import { refreshTrackStatuses } from "@/lib/server/track-statuses";
import { GET as getCsv, POST as postCsv } from "@/app/api/exports/[dataset]/route";
import { GET as getWorkbook } from "@/app/api/exports/workbook/route";
import { GET as getStudyRoute } from "@/app/api/studies/[studyId]/route";
import { GET as subjectFhir } from "@/app/api/studies/[studyId]/subjects/[subjectId]/fhir/route";
import { ORIGIN, actor, ctx, makePatient, makeSite, req, type Actor } from "../fixtures/factory";

// Every string below is invented; none may appear in a de-identified export.
const SECRET = {
  given: "Orsolya",
  family: "Quillfeather",
  mrn: "MRN-QX-55120987",
  email: "o.quillfeather@example.invalid",
  dob: "1933-03-10",
  indication: "Referred by Dr Vantongeren",
  plan: "Ring her at Larchmont Road before noon",
  lesionNote: "Zephyrine birthmark beside the lesion",
  complicationNote: "Fainted in the Wexcombe waiting room",
  addendum: "Sister Marisol Quillfeather called about results",
};

let siteA: string, siteB: string, studyId: string, xId: string;
let nurse: Actor, admin: Actor, clinician: Actor, reviewer: Actor, nurseB: Actor;

async function signedVisit(patientId: string, siteId: string, date: string, examinerId: string, status: "signed" | "draft" = "signed") {
  const [v] = await db.insert(s.visits).values({
    patientId, siteId, visitDate: date, examinerId, status, signedAt: status === "signed" ? new Date() : null,
    indication: SECRET.indication, plan: SECRET.plan,
  }).returning({ id: s.visits.id });
  return v!.id;
}

async function lesion(visitId: string, siteId: string, trackId: string, label: string, grade: "lsil" | "hsil", extra: { histology?: "lsil" | "hsil"; treat?: boolean } = {}) {
  const [l] = await db.insert(s.lesions).values({
    visitId, siteId, trackId, label, clockStartH: 1, clockEndH: 2, distanceStartCm: 1, distanceEndCm: 2, zone: "transformation_zone", grade, note: SECRET.lesionNote,
  }).returning({ id: s.lesions.id });
  if (extra.histology) await db.insert(s.biopsies).values({ visitId, siteId, lesionId: l!.id, specimenLabel: "A", clockH: 1, distanceCm: 1, histology: extra.histology });
  if (extra.treat) await db.insert(s.treatments).values({ visitId, siteId, lesionId: l!.id, modality: "electrocautery", arcs: [{ startH: 1, endH: 2 }], treatedFraction: 1 / 12, note: SECRET.plan });
}

beforeAll(async () => {
  siteA = (await makeSite("Research")).id;
  siteB = (await makeSite("Elsewhere")).id;
  nurse = await actor("research_nurse", [siteA]);
  admin = await actor("admin", [siteA]);
  clinician = await actor("clinician", [siteA]);
  reviewer = await actor("reviewer", [siteA]);
  nurseB = await actor("research_nurse", [siteB]);
  const [study] = await db.insert(s.studies).values({ code: `T-${siteA.slice(0, 6)}`, title: "Invented export study", startDate: "2024-01-01" }).returning();
  studyId = study!.id;
  await db.insert(s.studySites).values({ studyId, siteId: siteA });

  // X: 91 at enrolment, restricted ZIP, withdrawn on 2025-03-01.
  const x = await makePatient(siteA, { givenName: SECRET.given, familyName: SECRET.family, mrn: SECRET.mrn, contactEmail: SECRET.email, dateOfBirth: SECRET.dob, zip: "03601", consentResearch: true });
  xId = x.id;
  const [t1] = await db.insert(s.lesionTracks).values({ patientId: x.id, siteId: siteA, label: "T1" }).returning({ id: s.lesionTracks.id });
  const [t2] = await db.insert(s.lesionTracks).values({ patientId: x.id, siteId: siteA, label: "T2" }).returning({ id: s.lesionTracks.id });
  const v1 = await signedVisit(x.id, siteA, "2024-06-01", clinician.userId);
  await lesion(v1, siteA, t1!.id, "L1", "hsil", { treat: true });
  await lesion(v1, siteA, t2!.id, "L2", "lsil", { histology: "lsil" });
  const v2 = await signedVisit(x.id, siteA, "2024-12-01", clinician.userId);
  await lesion(v2, siteA, t2!.id, "L1", "lsil");
  await db.insert(s.complications).values({ visitId: v2, siteId: siteA, kind: "pain", severity: "mild", note: SECRET.complicationNote });
  await db.insert(s.addenda).values({ visitId: v2, siteId: siteA, authorId: clinician.userId, body: SECRET.addendum });
  const v3 = await signedVisit(x.id, siteA, "2025-03-01", clinician.userId); // on the withdrawal day
  await lesion(v3, siteA, t1!.id, "L1", "hsil", { histology: "hsil" });
  const v4 = await signedVisit(x.id, siteA, "2025-08-01", clinician.userId);
  await lesion(v4, siteA, t1!.id, "L1", "hsil");
  await refreshTrackStatuses(db, x.id, siteA);
  await db.insert(s.enrolments).values({ studyId, patientId: x.id, siteId: siteA, studySubjectId: "EXP-001", consentDate: "2024-06-01", withdrawnOn: "2025-03-01" });

  // Y: an ordinary enrolled patient with one HSIL visit.
  const y = await makePatient(siteA, { zip: "10027", dateOfBirth: "1980-05-05", consentResearch: true });
  const [ty] = await db.insert(s.lesionTracks).values({ patientId: y.id, siteId: siteA, label: "T1" }).returning({ id: s.lesionTracks.id });
  const vy = await signedVisit(y.id, siteA, "2024-01-15", clinician.userId);
  await lesion(vy, siteA, ty!.id, "L1", "hsil");
  await refreshTrackStatuses(db, y.id, siteA);
  await db.insert(s.enrolments).values({ studyId, patientId: y.id, siteId: siteA, studySubjectId: "EXP-002", consentDate: "2024-01-15" });
});

const csv = (dataset: string, who: Actor, query = "") =>
  getCsv(req("GET", `/api/exports/${dataset}?studyId=${studyId}${query}`, who), ctx({ dataset }));

/** The export form as the browser submits it (application/x-www-form-urlencoded, with its Origin). */
const postForm = (dataset: string, who: Actor, fields: Record<string, string>, origin = ORIGIN) =>
  postCsv(
    new Request(`${ORIGIN}/api/exports/${dataset}`, {
      method: "POST",
      headers: { host: "dentate.test", cookie: who.cookie, origin, "content-type": "application/x-www-form-urlencoded" },
      body: new URLSearchParams({ studyId, identified: "1", ...fields }).toString(),
    }),
    ctx({ dataset }),
  );

async function csvRows(dataset: string, query = "") {
  const res = await csv(dataset, nurse, query);
  expect(res.status).toBe(200);
  const text = await res.text();
  return { text, rows: parse(text, { columns: true }) as Record<string, string>[] };
}

/** Text of every file inside an xlsx (a zip): read the central directory, inflate each entry. */
function unzipText(buf: Buffer): string {
  const eocd = buf.lastIndexOf(Buffer.from([0x50, 0x4b, 0x05, 0x06]));
  const entries = buf.readUInt16LE(eocd + 10);
  let at = buf.readUInt32LE(eocd + 16);
  let text = "";
  for (let i = 0; i < entries; i++) {
    const method = buf.readUInt16LE(at + 10);
    const size = buf.readUInt32LE(at + 20);
    const nameLen = buf.readUInt16LE(at + 28);
    const local = buf.readUInt32LE(at + 42);
    const start = local + 30 + buf.readUInt16LE(local + 26) + buf.readUInt16LE(local + 28);
    const data = buf.subarray(start, start + size);
    text += (method === 8 ? inflateRawSync(data) : data).toString("utf8");
    at += 46 + nameLen + buf.readUInt16LE(at + 30) + buf.readUInt16LE(at + 32);
  }
  return text;
}

function expectNoIdentifier(text: string) {
  for (const value of [...Object.values(SECRET), xId, "1933", "2024-06-01", "2024-12-01", "03601"]) expect(text, value).not.toContain(value);
}

describe("de-identified CSV exports (research nurse)", () => {
  it("streams UTF-8 CSV as an attachment", async () => {
    const res = await csv("counts", nurse);
    expect(res.headers.get("content-type")).toBe("text/csv; charset=utf-8");
    expect(res.headers.get("content-disposition")).toMatch(/^attachment; filename=".+-counts-.+\.csv"$/);
    await res.text();
  });

  it("counts lesions per visit with day offsets from enrolment, withdrawn visits left out", async () => {
    const { text, rows } = await csvRows("counts");
    expectNoIdentifier(text);
    const x = rows.filter((r) => r.study_id === "EXP-001");
    // By hand: 2024-06-01 → 2024-12-01 = 30+31+31+30+31+30 = 183 days. Visits on/after 2025-03-01 are gone.
    expect(x.map((r) => [r.visit_seq, r.visit_day])).toEqual([["1", "0"], ["2", "183"]]);
    expect(x[0]).toMatchObject({ lesions: "2", impression_hsil: "1", impression_lsil: "1", histology_lsil: "1", lesions_treated: "1", tracks_new: "2" });
    expect(rows.filter((r) => r.study_id === "EXP-002")).toHaveLength(1);
  });

  it("gives one row per lesion with the track as study ID + label, none after withdrawal", async () => {
    const { text, rows } = await csvRows("lesions");
    expectNoIdentifier(text);
    expect(rows.filter((r) => r.study_id === "EXP-001").map((r) => `${r.track_id}@${r.visit_seq}`)).toEqual(["EXP-001-T1@1", "EXP-001-T2@1", "EXP-001-T2@2"]);
    expect(Object.keys(rows[0]!)).not.toContain("note");
  });

  it("reports outcomes with 90+, a withheld birth year and ZIP 000; recurrence after withdrawal is not seen", async () => {
    const { text, rows } = await csvRows("outcomes");
    expectNoIdentifier(text);
    const x = rows.find((r) => r.study_id === "EXP-001")!;
    // Born 1933-03-10, enrolled 2024-06-01: 91 → the over-89 category (45 CFR 164.514(b)(2)(i)(C)).
    expect(x.age_at_enrolment).toBe("90+");
    expect(x.birth_year).toBe("");
    expect(x.zip3).toBe("000"); // 036 is a restricted 3-digit ZIP area (45 CFR 164.514(b)(2), HHS guidance)
    // Treated on day 0, no HSIL at day 183: cleared after 183 days; the HSIL of 2025-03-01 lies on
    // the withdrawal day, so the patient is censored at the clearing visit.
    expect(x).toMatchObject({ visits: "2", first_hsil_day: "0", treatments: "1", days_treatment_to_clearance: "183", recurrence: "0", days_clearance_to_recurrence_or_censor: "0" });
    expect(rows.find((r) => r.study_id === "EXP-002")!.zip3).toBe("100");
  });

  it("keeps only the year in year mode", async () => {
    const { text, rows } = await csvRows("counts", "&dates=year");
    expectNoIdentifier(text);
    expect(rows.filter((r) => r.study_id === "EXP-001").map((r) => r.visit_year)).toEqual(["2024", "2024"]);
  });

  it("filters by grade and date range", async () => {
    expect((await csvRows("counts", "&grade=hsil")).rows.map((r) => `${r.study_id}@${r.visit_seq}`)).toEqual(["EXP-001@1", "EXP-002@1"]);
    expect((await csvRows("counts", "&from=2024-07-01&to=2025-12-31")).rows.map((r) => `${r.study_id}@${r.visit_seq}`)).toEqual(["EXP-001@2"]);
  });

  it("audits each export with who, the filter and the row count", async () => {
    const res = await csv("lesions", nurse, "&grade=lsil");
    await res.text();
    let row: typeof s.auditEvents.$inferSelect | undefined;
    for (let i = 0; i < 20 && !row; i++) {
      [row] = await db.select().from(s.auditEvents).where(and(eq(s.auditEvents.userId, nurse.userId), eq(s.auditEvents.action, "export.deidentified"))).orderBy(desc(s.auditEvents.id)).limit(1);
      if (!(row?.detail as { filter?: { grade?: string } } | undefined)?.filter?.grade) row = undefined;
      if (!row) await new Promise((r) => setTimeout(r, 100));
    }
    expect(row!.detail).toMatchObject({ datasets: ["lesions"], format: "csv", filter: { studyId, grade: "lsil" }, rows: { lesions: 2 }, outcome: "complete" });
  });
});

describe("workbook export", () => {
  it("holds the three datasets and no identifier in any byte of any part", async () => {
    const res = await getWorkbook(req("GET", `/api/exports/workbook?studyId=${studyId}`, nurse), ctx({}));
    expect(res.status).toBe(200);
    const buf = Buffer.from(await res.arrayBuffer());
    const text = unzipText(buf);
    expect(text).toContain("EXP-001"); // the unzip reads real content, so the search below can fail
    expectNoIdentifier(text);
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load(buf as unknown as ArrayBuffer);
    expect(wb.worksheets.map((w) => w.name)).toEqual(["Counts per visit", "Lesions", "Outcomes", "Data dictionary"]);
    const counts = wb.getWorksheet("Counts per visit")!;
    const xRows = counts.getSheetValues().filter((r) => Array.isArray(r) && r[1] === "EXP-001");
    expect(xRows).toHaveLength(2); // the two visits before withdrawal
  });
});

describe("de-identified FHIR bundle of a withdrawn subject", () => {
  it("holds only the encounters before the withdrawal and no identifier", async () => {
    const res = await subjectFhir(req("GET", `/api/studies/${studyId}/subjects/EXP-001/fhir`, nurse), ctx({ studyId, subjectId: "EXP-001" }));
    expect(res.status).toBe(200);
    const text = await res.text();
    for (const value of [SECRET.given, SECRET.family, SECRET.mrn, SECRET.email, SECRET.dob, xId]) expect(text).not.toContain(value);
    const bundle = JSON.parse(text) as { entry: { resource: { resourceType: string; period?: { start: string } } }[] };
    // Signed visits 2024-06-01 and 2024-12-01 only; dates cut to the year (Safe Harbor).
    expect(bundle.entry.filter((e) => e.resource.resourceType === "Encounter").map((e) => e.resource.period?.start)).toEqual(["2024", "2024"]);
  });
});

describe("the research nurse's study view agrees with the exports", () => {
  it("counts a withdrawn subject's signed visits up to the withdrawal, as the counts export does", async () => {
    // EXP-001 has signed visits on 2024-06-01, 2024-12-01, 2025-03-01 (the withdrawal day) and
    // 2025-08-01: the exports keep the first two (visits before the withdrawal date).
    const res = await getStudyRoute(req("GET", `/api/studies/${studyId}`, nurse), ctx({ studyId }));
    const view = (await res.json()) as { enrolments: { studySubjectId: string; signedVisits: number }[] };
    const { rows } = await csvRows("counts");
    for (const subject of ["EXP-001", "EXP-002"]) {
      const exported = rows.filter((r) => r.study_id === subject).length;
      expect(view.enrolments.find((e) => e.studySubjectId === subject)?.signedVisits, subject).toBe(exported);
    }
    expect(rows.filter((r) => r.study_id === "EXP-001").length).toBe(2);
  });
});

describe("who may export", () => {
  it("refuses clinicians and reviewers (403) and another site's nurse (404)", async () => {
    expect((await csv("counts", clinician)).status).toBe(403);
    expect((await csv("counts", reviewer)).status).toBe(403);
    expect((await csv("counts", nurseB)).status).toBe(404);
  });

  it("refuses an identified export to a nurse and to an admin without a reason", async () => {
    expect((await postForm("counts", nurse, { reason: "Statistical audit request" })).status).toBe(403);
    expect((await postForm("counts", admin, {})).status).toBe(400);
  });

  it("refuses an identified export started by a link (GET) or from another site's page, even with a reason", async () => {
    const reason = "Data-safety board re-identification request 7";
    expect((await csv("outcomes", admin, `&identified=1&reason=${encodeURIComponent(reason)}`)).status).toBe(403);
    expect((await postForm("outcomes", admin, { reason }, "https://elsewhere.example")).status).toBe(403);
  });

  // Common practice, no source: a reason in the audit log must let a reader understand the request.
  it.each(["..........", "aaaaaaaaaaaaaaa", "x x x x x x x x x x", "!!!! ???? ....", "asdfghjk", "0123456789 0123"])("refuses the meaningless reason %j with 400 on the reason field", async (reason) => {
    const res = await postForm("counts", admin, { reason });
    expect(res.status).toBe(400);
    expect(Object.keys((await res.json()).error.fields)).toEqual(["reason"]);
  });

  it("answers bad filters with 400 and an unknown dataset with 404, never reaching SQL", async () => {
    expect((await csv("counts", nurse, "&grade=hsil'--")).status).toBe(400);
    expect((await csv("counts", nurse, "&from=2024-02-30")).status).toBe(400);
    expect((await getCsv(req("GET", `/api/exports/counts?studyId=x'%20or%201=1`, nurse), ctx({ dataset: "counts" }))).status).toBe(400);
    expect((await getCsv(req("GET", `/api/exports/patients?studyId=${studyId}`, nurse), ctx({ dataset: "patients" }))).status).toBe(404);
  });

  it("lets an admin export identified data with a recorded reason", async () => {
    const reason = "Data-safety board re-identification request 7";
    const res = await postForm("outcomes", admin, { reason });
    expect(res.status).toBe(200);
    const text = await res.text();
    expect(text).toContain(SECRET.mrn); // positive control: the identified export does carry the MRN
    expect(text).toContain(SECRET.dob);
    let detail: { reason?: string } | undefined;
    for (let i = 0; i < 20 && !detail; i++) {
      const [row] = await db.select().from(s.auditEvents).where(and(eq(s.auditEvents.userId, admin.userId), eq(s.auditEvents.action, "export.identified"))).limit(1);
      detail = row?.detail as typeof detail;
      if (!detail) await new Promise((r) => setTimeout(r, 100));
    }
    expect(detail?.reason).toBe(reason);
  });
});
