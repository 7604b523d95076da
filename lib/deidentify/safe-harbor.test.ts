import { describe, expect, it } from "vitest";
import { RESTRICTED_ZIP3, ageCategory, dayOffset, deidentifyDate, yearOnly, zip3 } from "./safe-harbor";

// Source for every check here: HIPAA Safe Harbor, 45 CFR 164.514(b)(2), as summarised in
// 45 CFR 164.514(b)(2), HHS guidance (17 restricted 3-digit ZIP prefixes from HHS guidance, ages over 89 aggregated).

describe("zip3", () => {
  it("lists exactly the 17 restricted prefixes of the HHS guidance", () => {
    // 45 CFR 164.514(b)(2)(i)(B); HHS guidance table (2000 Census), 45 CFR 164.514(b)(2), HHS guidance.
    expect([...RESTRICTED_ZIP3].sort()).toEqual(
      ["036", "059", "063", "102", "203", "556", "692", "790", "821", "823", "830", "831", "878", "879", "884", "890", "893"],
    );
  });
  it("reports a restricted area as 000", () => {
    expect(zip3("03601")).toBe("000"); // 036 is restricted (45 CFR 164.514(b)(2), HHS guidance)
    expect(zip3("89301-1234")).toBe("000"); // 893 is restricted, ZIP+4 form
  });
  it("keeps the first three digits of an unrestricted area", () => {
    expect(zip3("10011")).toBe("100"); // 100 (Manhattan) is not on the list
    expect(zip3("102")).toBe("000"); // only 3 digits: not a ZIP code, so nothing is kept
  });
  it("reports malformed input as 000", () => {
    for (const bad of ["", "ABCDE", "1001", "100111", null, undefined]) expect(zip3(bad)).toBe("000");
  });
});

describe("ageCategory", () => {
  // Safe Harbor: "all ages over 89 ... aggregated into a single category of age 90 or older".
  it("collapses a 91-year-old into 90+", () => {
    expect(ageCategory("1933-03-10", "2024-06-01")).toBe("90+");
  });
  it("keeps an 89-year-old as 89", () => {
    expect(ageCategory("1935-01-01", "2024-12-31")).toBe("89");
  });
  it("turns 90 on the 90th birthday, not the day before", () => {
    // Completed years, the usual legal age (common practice, no source).
    expect(ageCategory("1934-06-01", "2024-05-31")).toBe("89");
    expect(ageCategory("1934-06-01", "2024-06-01")).toBe("90+");
  });
  it("refuses a date before birth", () => {
    expect(() => ageCategory("2000-01-02", "2000-01-01")).toThrow(RangeError);
  });
});

describe("dates", () => {
  // Safe Harbor keeps the year of a date and removes month and day.
  it("keeps only the year of a full date", () => {
    expect(yearOnly("2023-11-14")).toBe(2023);
    expect(yearOnly("2023-11-14T23:30:00Z")).toBe(2023);
  });
  it("counts days from the anchor, negative before it", () => {
    // By hand: 2024 is a leap year, so 1 Jan to 1 Mar = 31 + 29 = 60 days.
    expect(dayOffset("2024-03-01", "2024-01-01")).toBe(60);
    expect(dayOffset("2023-12-25", "2024-01-01")).toBe(-7);
  });
  it("gives one date in the export's chosen form", () => {
    expect(deidentifyDate("2024-03-01", "2024-01-01", "year")).toEqual({ mode: "year", year: 2024 });
    expect(deidentifyDate("2024-03-01", "2024-01-01", "offset")).toEqual({ mode: "offset", dayOffset: 60 });
  });
});
