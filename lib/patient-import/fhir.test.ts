import { describe, expect, it } from "vitest";
import { BIRTH_SEX_URL, readPatientBundle } from "./fhir";
import { checkRows } from "./rows";

// Field paths as in FHIR R4 Patient (hl7.org/fhir/R4/patient.html); identifier type "MR" from
// the v2-0203 code system; birth sex from the US Core birth-sex extension (codes F, M, UNK).
const patient = {
  resourceType: "Patient",
  identifier: [{ system: "urn:x:other", value: "X9" }, { type: { coding: [{ system: "http://terminology.hl7.org/CodeSystem/v2-0203", code: "MR" }] }, value: "M-77" }],
  name: [{ use: "nickname", family: "Nick" }, { use: "official", family: "Ibarra", given: ["Noor", "Ana"] }],
  birthDate: "1980-03-14",
  gender: "female",
  extension: [{ url: BIRTH_SEX_URL, valueCode: "M" }],
  address: [{ use: "work", postalCode: "11111" }, { use: "home", postalCode: "90210" }],
  telecom: [{ system: "phone", value: "555" }, { system: "email", value: "noor@example.test" }],
};

describe("readPatientBundle", () => {
  it("reads the MR identifier, the official name, birth sex from its extension (not gender), home postal code, e-mail", () => {
    const r = readPatientBundle({ resourceType: "Bundle", type: "collection", entry: [{ resource: patient }, { resource: { resourceType: "Observation" } }] });
    if (!r.ok) throw new Error(r.message);
    expect(r.problems).toEqual([{ line: 2, field: null, message: "A Observation, not a Patient: not imported." }]);
    const check = checkRows(r.table, r.mapping, "entry");
    expect(check.rows).toEqual([{ line: 1, values: { mrn: "M-77", familyName: "Ibarra", givenName: "Noor Ana", dateOfBirth: "1980-03-14", sexAtBirth: "male", postalCode: "90210", contactEmail: "noor@example.test" } }]);
  });

  it("takes sex at birth as unknown without the extension, and refuses what is not a Bundle", () => {
    const r = readPatientBundle({ resourceType: "Bundle", entry: [{ resource: { ...patient, extension: undefined } }] });
    expect(r.ok && checkRows(r.table, r.mapping, "entry").rows[0]!.values.sexAtBirth).toBe("unknown");
    expect(readPatientBundle({ resourceType: "Patient" })).toMatchObject({ ok: false });
  });
});
