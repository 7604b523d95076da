import { describe, expect, it } from "vitest";
import { FORBIDDEN_FIELDS, deidentifyPatient, type IdentifiedPatient } from "./deidentify-patient";

// Invented record; no real person.
const record: IdentifiedPatient = {
  id: "pt-7731",
  givenName: "Orsolya",
  familyName: "Quillfeather",
  mrn: "MRN-55120987",
  email: "o.quillfeather@example.invalid",
  phone: "+1 555 0142",
  notes: "Lives with sister on Larchmont Road; prefers afternoon slots",
  dateOfBirth: "1968-04-17",
  sexAtBirth: "male",
  hivStatus: "positive",
  riskGroups: ["msm_tw_hiv"],
  zip: "10027",
};

describe("deidentifyPatient", () => {
  const out = deidentifyPatient(record, { enrolmentDate: "2024-02-10", studySubjectId: "S-0042", dateMode: "offset" });
  const json = JSON.stringify(out);

  it("carries none of the record's identifiers (45 CFR 164.514(b)(2)(i))", () => {
    for (const value of [record.givenName, record.familyName, record.mrn, record.email, record.phone, record.notes, record.id]) {
      expect(json).not.toContain(value);
    }
    expect(json).not.toContain("1968-04-17"); // full date of birth: only the year may stay
    expect(json).not.toContain("10027"); // five-digit ZIP: only the first three digits may stay
    for (const field of FORBIDDEN_FIELDS) expect(out).not.toHaveProperty(field);
  });

  it("keeps the allowed facts", () => {
    // Age at enrolment by hand: 2024-02-10 minus 1968-04-17 = 55 completed years (birthday not yet reached).
    expect(out.ageCategory).toBe("55");
    expect(out.birthYear).toBe(1968); // year of a date may stay under Safe Harbor
    expect(out.zip3).toBe("100");
    expect(out.enrolmentYear).toBeNull(); // offset mode: enrolment is day 0
    expect(out.studySubjectId).toBe("S-0042");
  });

  it("withholds the birth year of a 91-year-old", () => {
    // Safe Harbor: dates (including year) indicative of an age over 89 are aggregated.
    const old = deidentifyPatient({ ...record, dateOfBirth: "1932-09-01" }, { enrolmentDate: "2024-02-10", studySubjectId: "S-1", dateMode: "year" });
    expect(old.ageCategory).toBe("90+");
    expect(old.birthYear).toBeNull();
    expect(old.enrolmentYear).toBe(2024);
  });

  it("withholds the birth year once the patient is over 89 at export", () => {
    const opts = { enrolmentDate: "2020-01-01", studySubjectId: "S-2", dateMode: "year" as const };
    // 89 at enrolment (born 1930-06-01), 94 at export in 2025.
    expect(deidentifyPatient({ ...record, dateOfBirth: "1930-06-01" }, opts).birthYear).toBe(1930);
    expect(deidentifyPatient({ ...record, dateOfBirth: "1930-06-01" }, { ...opts, asOfDate: "2025-01-01" }).birthYear).toBeNull();
  });

  it("refuses a study subject id built from the MRN", () => {
    expect(() => deidentifyPatient(record, { enrolmentDate: "2024-02-10", studySubjectId: "X-MRN-55120987", dateMode: "year" })).toThrow();
  });
});
