// Importing patients from a CSV file against the real database: the per-line report, nothing
// written while any row is bad, exactly the good rows written on the explicit choice, and a
// second import of the same file changing nothing (table checksums, tests/support/db-checksum.ts).
import { beforeAll, describe, expect, it } from "vitest";
import { and, asc, eq, sql as dsql } from "drizzle-orm";
import { db } from "@/db/client";
import { auditEvents, patients } from "@/db/schema";
import { actor, makePatient, makeSite, type Actor } from "../fixtures/factory";
import { changedTables, tableChecksums } from "../support/db-checksum";
import { checkFile, importFile } from "../support/patient-import";

let siteId: string;
let clinician: Actor, reviewer: Actor, outsider: Actor;

// Invented people. Line numbers count the header as line 1.
const CSV = [
  "MRN,Family name,Given name,Date of birth,Sex at birth,HIV status,Risk groups,Postal code,Email", // 1
  "IMP-1,Ibarra,Noor,1980-03-14,F,positive,msm_tw_hiv;solid_organ_transplant,90210,noor@example.test", // 2 good
  "IMP-2,Quill,Tam,14/03/1980,M,,,,", // 3 bad date
  "IMP-3,Okafor,Ada,1975-06-30,F,,,,", // 4 MRN repeated on line 8
  "IMP-4,,Rui,1981-02-02,M,,,,", // 5 missing family name
  `IMP-5,${"L".repeat(10_000)},Bea,1969-09-09,F,,,,`, // 6 a 10,000-character field
  'IMP-6,"=HYPERLINK(""http://x"",""y"")",Cai,1990-01-01,M,,,,', // 7 a formula cell
  "IMP-3,Okafor,Ada,1975-06-30,F,,,,", // 8 MRN repeated on line 4
  "IMP-7,Marsh,Lee,1958-12-01,M,negative,,10001,", // 9 good
  "IMP-8,Vance,Kit,1966-04-04,F,,,,", // 10 MRN already held at the site by someone else
  "IMP-9,Hale,Jo,1972-07-07,male,unknown,other,,", // 11 good
].join("\r\n");

beforeAll(async () => {
  siteId = (await makeSite("Import")).id;
  clinician = await actor("clinician", [siteId]);
  reviewer = await actor("reviewer", [siteId]);
  outsider = await actor("clinician", [(await makeSite("Elsewhere")).id]);
  await makePatient(siteId, { mrn: "IMP-8", familyName: "Someone", givenName: "Else", dateOfBirth: "1950-01-01" });
});

const body = (extra: Record<string, unknown> = {}) => ({ siteId, format: "csv", fileName: "clinic.csv", content: CSV, ...extra });
const sitePatients = () =>
  db.select({ mrn: patients.mrn, familyName: patients.familyName, dateOfBirth: patients.dateOfBirth }).from(patients).where(eq(patients.siteId, siteId)).orderBy(asc(patients.mrn));

describe("CSV import", () => {
  it("reports every bad line with its reasons, maps the columns by header, and writes nothing", async () => {
    const before = await tableChecksums();
    const { status, body: report } = await checkFile(clinician, body());
    expect(status).toBe(200);
    expect(report.total).toBe(10);
    expect(report.mapping).toMatchObject({ mrn: 0, familyName: 1, givenName: 2, dateOfBirth: 3, sexAtBirth: 4, hivStatus: 5, riskGroups: 6, postalCode: 7, contactEmail: 8 });
    expect(report.preview.map((r) => r.line)).toEqual([2, 3, 4, 5, 6, 7, 8, 9, 10, 11]);
    const lines = (n: number) => report.problems.filter((p) => p.line === n).map((p) => p.message);
    expect(report.problems.map((p) => p.line).filter((l, i, a) => a.indexOf(l) === i)).toEqual([3, 4, 5, 6, 7, 8, 10]);
    expect(lines(3)).toEqual(["Date of birth: Use a date like 1980-03-14 (year-month-day)."]);
    expect(lines(4)).toEqual(["MRN: IMP-3 appears on lines 4, 8 of this file; keep one line per patient."]);
    expect(lines(5)).toEqual(["Family name: The family name is missing."]);
    expect(lines(6)).toEqual(["Column 2 (Family name) holds 10,000 characters; a cell may hold at most 1,000."]);
    expect(lines(7)).toEqual([expect.stringMatching(/^Family name: Starts with "=", which a spreadsheet would run as a formula/)]);
    expect(lines(10)).toEqual([expect.stringMatching(/^MRN: IMP-8 already belongs to a patient at this site with another family name or date of birth/)]);
    expect(report.badRows).toBe(7);
    expect(report.plan).toEqual({ create: 3, update: 0, unchanged: 0 });
    expect(changedTables(before, await tableChecksums())).toEqual([]);
  });

  it("refuses to import a file with bad rows unless the good ones are chosen explicitly, writing nothing", async () => {
    const before = await tableChecksums();
    const r = await importFile(clinician, body());
    expect(r.status).toBe(400);
    expect(r.refusal!.error.message).toBe("7 of 10 rows have problems, so nothing was imported. Correct them, or choose to import only the valid rows.");
    expect(r.refusal!.report!.problems.length).toBeGreaterThanOrEqual(7);
    expect((await importFile(clinician, body({ acceptValidRows: false }))).status).toBe(400);
    expect(changedTables(before, await tableChecksums())).toEqual([]);
  });

  it("imports exactly the valid rows on the explicit choice, with progress, one audit row per patient and one for the import", async () => {
    const r = await importFile(clinician, body({ acceptValidRows: true }));
    expect(r.status).toBe(200);
    expect(r.events[0]).toEqual({ stage: "writing", done: 0, total: 3 });
    expect(r.last).toMatchObject({ stage: "done", result: { created: 3, updated: 0, unchanged: 0, skipped: 7 } });
    expect(await sitePatients()).toEqual([
      { mrn: "IMP-1", familyName: "Ibarra", dateOfBirth: "1980-03-14" },
      { mrn: "IMP-7", familyName: "Marsh", dateOfBirth: "1958-12-01" },
      { mrn: "IMP-8", familyName: "Someone", dateOfBirth: "1950-01-01" },
      { mrn: "IMP-9", familyName: "Hale", dateOfBirth: "1972-07-07" },
    ]);
    const [noor] = await db.execute(dsql`select risk_groups::text[] as "riskGroups", zip as "postalCode", hiv_status as "hivStatus", contact_email as "contactEmail", version from patients where site_id = ${siteId} and mrn = 'IMP-1'`);
    expect(noor).toEqual({ riskGroups: ["msm_tw_hiv", "solid_organ_transplant"], postalCode: "90210", hivStatus: "positive", contactEmail: "noor@example.test", version: 1 });
    const { importId } = (r.last as { result: { importId: string } }).result;
    const audits = await db.select({ action: auditEvents.action, detail: auditEvents.detail }).from(auditEvents).where(and(eq(auditEvents.siteId, siteId), eq(auditEvents.userId, clinician.userId)));
    expect(audits.filter((a) => a.action === "patient.create")).toHaveLength(3);
    expect(audits.filter((a) => a.action === "patient.import").map((a) => a.detail)).toEqual([expect.objectContaining({ importId, rows: 10, created: 3, skipped: 7, format: "csv", fileName: "clinic.csv" })]);
  });

  it("changes nothing when the same file is imported again: no patient row, no version, no patient audit row", async () => {
    const before = await tableChecksums();
    const countPatientAudits = async () => (await db.select().from(auditEvents).where(and(eq(auditEvents.siteId, siteId), eq(auditEvents.entityType, "patient")))).length;
    const auditsBefore = await countPatientAudits();
    const r = await importFile(clinician, body({ acceptValidRows: true }));
    expect(r.last).toMatchObject({ stage: "done", result: { created: 0, updated: 0, unchanged: 3, skipped: 7 } });
    expect(changedTables(before, await tableChecksums())).toEqual([]);
    expect(await countPatientAudits()).toBe(auditsBefore);
  });

  it("updates a known patient's changed fields with a new version and the before and after in the audit", async () => {
    const changed = CSV.replace("IMP-7,Marsh,Lee,1958-12-01,M,negative,,10001,", "IMP-7,Marsh,Lee,1958-12-01,M,positive,,10002,");
    const r = await importFile(clinician, body({ content: changed, acceptValidRows: true }));
    expect(r.last).toMatchObject({ stage: "done", result: { created: 0, updated: 1, unchanged: 2 } });
    const [lee] = await db.execute(dsql`select id, version, hiv_status as "hivStatus", zip as "postalCode" from patients where site_id = ${siteId} and mrn = 'IMP-7'`);
    expect(lee).toMatchObject({ version: 2, hivStatus: "positive", postalCode: "10002" });
    const [audit] = await db.select({ detail: auditEvents.detail }).from(auditEvents).where(and(eq(auditEvents.patientId, String(lee!.id)), eq(auditEvents.action, "patient.update")));
    expect(audit!.detail).toMatchObject({ changes: { hivStatus: { before: "negative", after: "positive" }, postalCode: { before: "10001", after: "10002" } }, version: 2 });
  });

  it("takes a mapping chosen by the user, and says which required field has no column", async () => {
    const content = "Ref;Nom;Prénom;Né le;Sexe\nQ-1;Durand;Léa;1985-05-05;F\n";
    const guessed = await checkFile(clinician, body({ content }));
    expect(guessed.body.mappingProblems).toEqual(expect.arrayContaining(["Choose the column that holds MRN.", "Choose the column that holds family name."]));
    const mapping = { mrn: 0, familyName: 1, givenName: 2, dateOfBirth: 3, sexAtBirth: 4, postalCode: null, hivStatus: null, riskGroups: null, contactEmail: null };
    const chosen = await checkFile(clinician, body({ content, mapping }));
    expect(chosen.body).toMatchObject({ mappingProblems: [], problems: [], plan: { create: 1, update: 0, unchanged: 0 } });
  });

  it("refuses past the limits with a clear message, and refuses reviewers (403) and other sites (404)", async () => {
    const big = await checkFile(clinician, body({ content: "MRN\n" + "x".repeat(9 * 1024 * 1024) }));
    expect(big.status).toBe(413);
    expect(big.body.error!.message).toMatch(/at most 8 MB can be imported at once/);
    const many = await checkFile(clinician, body({ content: "MRN\n" + Array.from({ length: 10_001 }, (_, i) => `R${i}`).join("\n") }));
    expect(many.status).toBe(400);
    expect(many.body.error!.message).toBe("The file has more than 10,000 patient rows. Split it into files of at most 10,000 rows.");
    expect((await checkFile(reviewer, body())).status).toBe(403);
    expect((await importFile(reviewer, body({ acceptValidRows: true }))).status).toBe(403);
    expect((await importFile(outsider, body({ acceptValidRows: true }))).status).toBe(404);
  });
});
