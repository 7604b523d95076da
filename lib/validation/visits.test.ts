import { describe, expect, it } from "vitest";
import { createVisitSchema } from "./visits";
import { examDetailsSchema } from "./visit-record";

// Gregorian calendar: February has 28 days, 29 in a leap year (2024 is one, 2025 is not).
describe("visit dates are real calendar days", () => {
  const base = { patientPosition: "lithotomy" as const };
  it.each(["2026-02-30", "2025-02-29", "2026-04-31", "2026-13-01", "2026-00-10"])("refuses %s", (visitDate) => {
    expect(createVisitSchema.safeParse({ ...base, visitDate }).success).toBe(false);
    expect(examDetailsSchema.safeParse({ ...base, visitDate, cytology: "not_done", hpvResult: "not_done", version: 1 }).success).toBe(false);
  });
  it.each(["2024-02-29", "2026-12-31", "2026-03-14"])("accepts %s", (visitDate) => {
    expect(createVisitSchema.safeParse({ ...base, visitDate }).success).toBe(true);
  });
});
