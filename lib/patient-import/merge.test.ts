import { describe, expect, it } from "vitest";
import { planRow, type StoredPatient } from "./merge";

const stored: StoredPatient = {
  id: "p1", version: 3, mrn: "M1", familyName: "Ibarra", givenName: "Noor", dateOfBirth: "1980-03-14", sexAtBirth: "female",
  postalCode: "90210", hivStatus: "positive", riskGroups: ["msm_tw_hiv"], contactEmail: null,
};
const row = { mrn: "M1", familyName: "Ibarra", givenName: "Noor", dateOfBirth: "1980-03-14", sexAtBirth: "female" as const };

describe("planRow", () => {
  it("creates with the defaults of an empty registration form", () => {
    expect(planRow(null, row)).toEqual({ kind: "create", values: { ...row, postalCode: null, hivStatus: "unknown", riskGroups: [], contactEmail: null } });
  });

  it("changes nothing when the row says what is stored, or leaves cells empty, or says unknown", () => {
    expect(planRow(stored, row).kind).toBe("unchanged");
    expect(planRow(stored, { ...row, familyName: "IBARRA", hivStatus: "unknown", sexAtBirth: "unknown", riskGroups: ["msm_tw_hiv"] }).kind).not.toBe("conflict");
    expect(planRow(stored, { ...row, hivStatus: "unknown", sexAtBirth: "unknown", riskGroups: ["msm_tw_hiv"] }).kind).toBe("unchanged");
  });

  it("updates the fields that differ, with before and after", () => {
    const plan = planRow(stored, { ...row, postalCode: "10001", riskGroups: ["msm_tw_hiv", "solid_organ_transplant"] });
    expect(plan).toMatchObject({
      kind: "update",
      changes: { postalCode: { before: "90210", after: "10001" }, riskGroups: { before: ["msm_tw_hiv"], after: ["msm_tw_hiv", "solid_organ_transplant"] } },
      values: { postalCode: "10001", hivStatus: "positive", givenName: "Noor" },
    });
  });

  it("refuses a known MRN given to someone born another day or with another family name", () => {
    expect(planRow(stored, { ...row, dateOfBirth: "1980-03-15" }).kind).toBe("conflict");
    expect(planRow(stored, { ...row, familyName: "Quill" }).kind).toBe("conflict");
  });
});
