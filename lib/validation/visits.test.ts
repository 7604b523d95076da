import { describe, expect, it } from "vitest";
import { createVisitSchema } from "./visits";
import { examDetailsSchema } from "./visit-record";
import { careDayProblem } from "./dates";

// Gregorian calendar: February has 28 days, 29 in a leap year (2024 is one, 2025 is not).
describe("visit dates are real calendar days", () => {
  const base = { patientPosition: "lithotomy" as const };
  it.each(["2026-02-30", "2025-02-29", "2026-04-31", "2026-13-01", "2026-00-10"])("refuses %s", (visitDate) => {
    expect(createVisitSchema.safeParse({ ...base, visitDate }).success).toBe(false);
    expect(examDetailsSchema.safeParse({ ...base, visitDate, cytology: "not_done", hpvResult: "not_done", version: 1 }).success).toBe(false);
  });
  it.each(["2024-02-29", "2025-12-31", "2026-03-14"])("accepts %s", (visitDate) => {
    expect(createVisitSchema.safeParse({ ...base, visitDate }).success).toBe(true);
  });
});

// Bounds of a date of care: not before the patient's birth, not more than a day after today
// (common practice, no source: a record cannot describe an exam before birth or in the future;
// the one-day margin covers a clinic a time zone ahead). 9999-12-31 is the value that took list
// pages down, because the day after it cannot be written as YYYY-MM-DD.
describe("visit and exam dates are bounded", () => {
  const base = { patientPosition: "lithotomy" as const };
  const exam = { ...base, cytology: "not_done", hpvResult: "not_done", version: 1 };
  const day = (offset: number) => new Date(Date.now() + offset * 86_400_000).toISOString().slice(0, 10);
  it.each(["9999-12-31", "1899-12-31", day(2), day(30)])("refuses the visit date %s with a field message", (visitDate) => {
    const r = createVisitSchema.safeParse({ ...base, visitDate });
    expect(r.success).toBe(false);
    expect(r.error?.issues[0]?.path).toEqual(["visitDate"]);
    expect(examDetailsSchema.safeParse({ ...exam, visitDate }).success).toBe(false);
  });
  it.each([day(0), day(-1), day(1)])("accepts the visit date %s", (visitDate) => {
    expect(createVisitSchema.safeParse({ ...base, visitDate }).success).toBe(true);
  });
  it("refuses an exam time years ahead", () => {
    const r = examDetailsSchema.safeParse({ ...exam, visitDate: day(0), examStartedAt: "9999-12-31T10:00:00Z" });
    expect(r.success).toBe(false);
  });
  it("refuses a day of care before the patient's birth", () => {
    expect(careDayProblem("1979-12-31", { birthDate: "1980-01-01" })).toMatch(/birth/);
    expect(careDayProblem("1980-01-01", { birthDate: "1980-01-01" })).toBeNull();
  });
});
