// Importing a FHIR R4 Bundle of Patient resources: a bundle that fails validation against the R4
// definitions (@medplum/core validateResource, as the exports are checked) is refused with the
// validator's own messages and writes nothing; a valid one imports, and again changes nothing.
import { beforeAll, describe, expect, it } from "vitest";
import { asc, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { patients } from "@/db/schema";
import { actor, makeSite, type Actor } from "../fixtures/factory";
import { changedTables, tableChecksums } from "../support/db-checksum";
import { checkFile, importFile } from "../support/patient-import";
import { loadFhirValidator, problemsOf } from "../support/fhir-validator";

let siteId: string;
let admin: Actor;

// Invented people. Field paths as in FHIR R4 Patient; "MR" from the v2-0203 identifier types;
// birth sex from the US Core birth-sex extension.
const mr = (value: string) => ({ type: { coding: [{ system: "http://terminology.hl7.org/CodeSystem/v2-0203", code: "MR" }] }, system: "urn:dentate:test:mrn", value });
const birthSex = (code: string) => [{ url: "http://hl7.org/fhir/us/core/StructureDefinition/us-core-birthsex", valueCode: code }];
const bundle = (patientsIn: object[]) => ({ resourceType: "Bundle", type: "collection", entry: patientsIn.map((resource) => ({ resource })) });
const GOOD = bundle([
  { resourceType: "Patient", identifier: [mr("FH-1")], name: [{ use: "official", family: "Ostrander", given: ["Mae"] }], birthDate: "1977-08-09", gender: "female", extension: birthSex("F"), address: [{ postalCode: "02134" }] },
  { resourceType: "Patient", identifier: [mr("FH-2")], name: [{ family: "Pike", given: ["Jon", "Erik"] }], birthDate: "1963-11-20", gender: "male", telecom: [{ system: "email", value: "jon@example.test" }] },
]);

beforeAll(async () => {
  siteId = (await makeSite("FHIR")).id;
  admin = await actor("admin", [siteId]);
  await loadFhirValidator();
});

const body = (b: unknown, extra: Record<string, unknown> = {}) => ({ siteId, format: "fhir", content: JSON.stringify(b), ...extra });

describe("FHIR bundle import", () => {
  it("refuses a bundle the validator rejects, with the validator's messages, and writes nothing", async () => {
    const bad = bundle([{ resourceType: "Patient", identifier: [mr("FH-9")], name: [{ family: "Ray" }], birthDate: "1980-13-01" }]);
    // The messages must be the validator's own: compare with what it says of the same bundle.
    const expected = problemsOf(bad).filter((l) => l.startsWith("error"));
    expect(expected.length).toBeGreaterThan(0);
    const before = await tableChecksums();
    for (const send of [() => checkFile(admin, body(bad)), async () => { const r = await importFile(admin, body(bad, { acceptValidRows: true })); return { status: r.status, body: r.refusal! } }]) {
      const r = await send();
      expect(r.status).toBe(400);
      expect(r.body.error!.message).toBe("The bundle does not pass FHIR R4 validation, so nothing was read from it.");
      expect(r.body.error!.fields!.file).toEqual(expected);
      expect(r.body.error!.fields!.file!.join()).toContain("Bundle.entry[0].resource.birthDate");
    }
    expect(changedTables(before, await tableChecksums())).toEqual([]);
  });

  it("refuses what is not JSON or not a Bundle", async () => {
    expect((await checkFile(admin, { siteId, format: "fhir", content: "MRN,Name\n1,x" })).body.error!.message).toBe("The file is not JSON, so it cannot be a FHIR bundle.");
    const notBundle = await checkFile(admin, body({ resourceType: "Patient", birthDate: "1980-01-01" }));
    expect(notBundle.status).toBe(400);
  });

  it("previews and imports a valid bundle; importing it again changes nothing", async () => {
    expect(problemsOf(GOOD)).toEqual([]);
    const check = await checkFile(admin, body(GOOD));
    expect(check.body).toMatchObject({ unit: "entry", total: 2, problems: [], plan: { create: 2, update: 0, unchanged: 0 } });
    const r = await importFile(admin, body(GOOD));
    expect(r.last).toMatchObject({ stage: "done", result: { created: 2, updated: 0, unchanged: 0, skipped: 0 } });
    const rows = await db.select({ mrn: patients.mrn, familyName: patients.familyName, givenName: patients.givenName, sexAtBirth: patients.sexAtBirth, contactEmail: patients.contactEmail }).from(patients).where(eq(patients.siteId, siteId)).orderBy(asc(patients.mrn));
    expect(rows).toEqual([
      { mrn: "FH-1", familyName: "Ostrander", givenName: "Mae", sexAtBirth: "female", contactEmail: null },
      // No birth-sex extension: sex at birth unknown, whatever the administrative gender says.
      { mrn: "FH-2", familyName: "Pike", givenName: "Jon Erik", sexAtBirth: "unknown", contactEmail: "jon@example.test" },
    ]);
    const before = await tableChecksums();
    expect((await importFile(admin, body(GOOD))).last).toMatchObject({ stage: "done", result: { created: 0, updated: 0, unchanged: 2 } });
    expect(changedTables(before, await tableChecksums())).toEqual([]);
  });
});
