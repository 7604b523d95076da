import { describe, expect, it } from "vitest";
import { CLOCK_FACE_SNOMED, clockFaceCoding, clockHoursCovered, nearestClockHour } from "./terminology";

describe("SNOMED clock-face codes", () => {
  it("matches the FHIR clock-face value set for all twelve hours", () => {
    // Copied by hand from the FHIR value set
    // bodystructure-bodylandmarkorientation-clockface-position (SNOMED CT).
    const table: Record<number, string> = {
      1: "260318004", 2: "260328008", 3: "260330005", 4: "260333007", 5: "260335000", 6: "260337008",
      7: "260339006", 8: "260341007", 9: "260343005", 10: "260322009", 11: "260324005", 12: "260326007",
    };
    for (let hour = 1; hour <= 12; hour++) expect(clockFaceCoding(hour).code).toBe(table[hour]);
    expect(new Set(Object.values(CLOCK_FACE_SNOMED)).size).toBe(12);
  });
  it("rounds a stored decimal hour to the nearest whole hour, with 0 as 12", () => {
    // Stored frame: decimal hours in [0, 12), 12 o'clock stored as 0 (project convention).
    expect(nearestClockHour(0)).toBe(12);
    expect(nearestClockHour(11.6)).toBe(12);
    expect(nearestClockHour(2.4)).toBe(2);
    expect(nearestClockHour(2.5)).toBe(3);
  });
  it("lists the hours an arc covers clockwise, across 12", () => {
    expect(clockHoursCovered(10.8, 1.2)).toEqual([11, 12, 1]);
    expect(clockHoursCovered(3, 3)).toEqual([3]);
    expect(clockHoursCovered(2, 4)).toEqual([2, 3, 4]);
  });
});
