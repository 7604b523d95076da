import { describe, expect, it } from "vitest";
import { addMonths, daysBetween, fullYearsBetween, toCalendarDate } from "./calendar";

// Gregorian calendar facts (common practice, no source needed beyond the calendar itself).
describe("calendar", () => {
  it("rejects impossible days", () => {
    expect(() => toCalendarDate("2023-02-29")).toThrow(RangeError); // 2023 is not a leap year
    expect(toCalendarDate("2024-02-29")).toEqual({ year: 2024, month: 2, day: 29 });
  });
  it("clamps month arithmetic to the month's last day", () => {
    expect(addMonths("2024-01-31", 1)).toBe("2024-02-29");
    expect(addMonths("2023-01-31", 1)).toBe("2023-02-28");
    expect(addMonths("2024-11-15", 3)).toBe("2025-02-15");
    expect(addMonths("2024-03-15", -6)).toBe("2023-09-15");
  });
  it("counts a 29 February birthday as reached on 1 March in common years", () => {
    expect(fullYearsBetween("2000-02-29", "2001-02-28")).toBe(0);
    expect(fullYearsBetween("2000-02-29", "2001-03-01")).toBe(1);
  });
  it("counts 365 days in a common year and 366 in a leap year", () => {
    expect(daysBetween("2023-01-01", "2024-01-01")).toBe(365);
    expect(daysBetween("2024-01-01", "2025-01-01")).toBe(366);
  });
});
