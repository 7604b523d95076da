import { describe, expect, it } from "vitest";
import { screeningSuggestion, screeningSuggestionForGroups } from "./eligibility";

// IANS 2024 consensus: Stier EA et al., Int J Cancer 2024;154:1694-1702 (Stier EA et al., Int J Cancer 2024).

describe("screeningSuggestion by age", () => {
  it("starts MSM and transgender women with HIV at 35, not a day before", () => {
    const base = { riskGroup: "msm_tw_hiv", dob: "1990-03-15" } as const;
    const before = screeningSuggestion({ ...base, today: "2025-02-14" }); // 34 years 11 months
    expect(before.eligibleNow).toBe(false);
    expect(before.startDate).toBe("2025-03-15");
    expect(screeningSuggestion({ ...base, today: "2025-03-14" }).eligibleNow).toBe(false);
    expect(screeningSuggestion({ ...base, today: "2025-03-15" }).eligibleNow).toBe(true);
  });
  it("starts other people with HIV, and MSM/TW without HIV, at 45", () => {
    for (const riskGroup of ["other_hiv", "msm_tw_no_hiv"] as const) {
      expect(screeningSuggestion({ riskGroup, dob: "1980-06-01", today: "2025-05-31" }).eligibleNow).toBe(false); // 44
      expect(screeningSuggestion({ riskGroup, dob: "1980-06-01", today: "2025-06-01" }).eligibleNow).toBe(true); // 45
    }
  });
  it("starts the cervical, warts and HPV16 groups at 45 with shared decision-making", () => {
    // From memory: Stier EA et al., Int J Cancer 2024 notes the stored abstract was cut off for these groups.
    const s = screeningSuggestion({ riskGroup: "perianal_warts", dob: "1979-01-10", today: "2024-01-10" });
    expect(s.eligibleNow).toBe(true);
    expect(s.reason).toMatch(/shared decision/);
  });
  it("handles a 29 February birthday as turning 35 on 1 March", () => {
    // Completed years (common practice, no source).
    expect(screeningSuggestion({ riskGroup: "msm_tw_hiv", dob: "1988-02-29", today: "2023-02-28" }).startDate).toBe("2023-03-01");
  });
});

describe("screeningSuggestion by event", () => {
  it("starts transplant recipients 10 years after transplant", () => {
    const base = { riskGroup: "solid_organ_transplant", dob: "1990-01-01", transplantDate: "2014-09-30" } as const;
    expect(screeningSuggestion({ ...base, today: "2024-09-29" }).eligibleNow).toBe(false);
    expect(screeningSuggestion({ ...base, today: "2024-09-30" })).toMatchObject({ eligibleNow: true, startDate: "2024-09-30" });
  });
  it("asks for the transplant date rather than guessing", () => {
    const s = screeningSuggestion({ riskGroup: "solid_organ_transplant", dob: "1990-01-01", today: "2024-01-01" });
    expect(s).toMatchObject({ eligibleNow: false, startDate: null });
  });
  it("suggests screening within a year of a vulvar HSIL diagnosis", () => {
    const s = screeningSuggestion({ riskGroup: "vulvar_hsil_or_cancer", dob: "1985-04-04", today: "2024-05-01", diagnosisDate: "2024-03-20" });
    expect(s).toMatchObject({ eligibleNow: true, startDate: "2024-03-20" });
    expect(s.reason).toContain("2025-03-20");
  });
  it("offers nothing for a patient in no group", () => {
    expect(screeningSuggestion({ riskGroup: "other", dob: "1950-01-01", today: "2024-01-01" })).toMatchObject({ eligibleNow: false, startDate: null });
  });
  it("always defers to local guidelines and the clinician", () => {
    for (const riskGroup of ["msm_tw_hiv", "other", "solid_organ_transplant"] as const) {
      expect(screeningSuggestion({ riskGroup, dob: "1970-01-01", today: "2024-01-01" }).caution).toMatch(/local guidelines.*clinician/);
    }
  });
});

describe("screeningSuggestionForGroups: several IANS 2024 groups take the earliest start", () => {
  // Ages and intervals from IANS 2024 (Stier EA et al., Int J Cancer 2024;154:1694-1702): MSM/TW with HIV
  // from 35, other people with HIV from 45, transplant recipients from 10 years after transplant.
  it("a man living with HIV transplanted at 20 starts at 30 (transplant rule), not at 35", () => {
    const s = screeningSuggestionForGroups({ riskGroups: ["msm_tw_hiv", "solid_organ_transplant"], dob: "1990-05-01", transplantDate: "2010-05-01", today: "2019-06-01" });
    expect(s).toMatchObject({ startDate: "2020-05-01", eligibleNow: false });
    expect(s.reason).toMatch(/transplant/);
  });
  it("a person with HIV transplanted at 40 starts at 45 (HIV rule), not at 50", () => {
    const s = screeningSuggestionForGroups({ riskGroups: ["solid_organ_transplant", "other_hiv"], dob: "1970-02-10", transplantDate: "2010-02-10", today: "2015-02-10" });
    expect(s).toMatchObject({ startDate: "2015-02-10", eligibleNow: true });
    expect(s.reason).toMatch(/from age 45/);
  });
  it("vulvar HSIL qualifies now even when another group would start later", () => {
    // IANS 2024: vulvar HSIL or cancer, screening within 1 year of diagnosis.
    const s = screeningSuggestionForGroups({ riskGroups: ["msm_tw_no_hiv", "vulvar_hsil_or_cancer"], dob: "1995-01-01", today: "2024-01-01" });
    expect(s.eligibleNow).toBe(true);
    expect(s.reason).toMatch(/Vulvar/);
  });
  it("the order of the set does not change the answer", () => {
    const a = screeningSuggestionForGroups({ riskGroups: ["msm_tw_hiv", "other_hiv"], dob: "1990-03-15", today: "2025-03-15" });
    const b = screeningSuggestionForGroups({ riskGroups: ["other_hiv", "msm_tw_hiv"], dob: "1990-03-15", today: "2025-03-15" });
    expect(a).toEqual(b);
    expect(a).toMatchObject({ startDate: "2025-03-15", eligibleNow: true });
  });
  it("asks for the transplant date when that is the only group that could apply", () => {
    const s = screeningSuggestionForGroups({ riskGroups: ["other", "solid_organ_transplant"], dob: "1990-01-01", today: "2024-01-01" });
    expect(s.reason).toMatch(/record the transplant date/);
  });
  it("an empty set is no group", () => {
    expect(screeningSuggestionForGroups({ riskGroups: [], dob: "1950-01-01", today: "2024-01-01" })).toMatchObject({ eligibleNow: false, startDate: null });
  });
});
