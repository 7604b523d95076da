import { describe, expect, it } from "vitest";
import { clinicianDigestMail, patientReminderMail } from "./templates";

// Mail leaves the clinic's systems: no diagnosis or finding may be in it (HIPAA minimum
// necessary, 45 CFR 164.502(b)); the words below name the diseases and findings Dentate records.
const CLINICAL_WORDS = /hsil|lsil|dysplasia|cancer|anal|anus|hpv|biopsy|lesion|condyloma|wart|hiv|screening|anoscopy/i;

describe("mail bodies carry no clinical details", () => {
  it("the clinician digest gives a count and a link only", () => {
    const m = clinicianDigestMail({ displayName: "Dr Test", overdueCount: 3, link: "https://x.example/worklist" });
    expect(m.text).toContain("3 patients");
    expect(m.text).toContain("https://x.example/worklist");
    expect(`${m.subject}\n${m.text}`).not.toMatch(CLINICAL_WORDS);
  });

  it("the patient reminder is neutral", () => {
    const m = patientReminderMail({ givenName: "Alex", clinicName: "Harbourside Health Centre" });
    expect(`${m.subject}\n${m.text}`).not.toMatch(CLINICAL_WORDS);
  });

  it("the patient reminder is signed with the clinic's name, not the product's (the dentate line is anatomy)", () => {
    const m = patientReminderMail({ givenName: "Alex", clinicName: "Harbourside Health Centre" });
    expect(m.text).toMatch(/— Harbourside Health Centre\n/);
    expect(`${m.subject}\n${m.text}`).not.toMatch(/dentate/i);
  });
});
