import { describe, expect, it } from "vitest";
import { addMonths } from "@/lib/dates/calendar";
import { qualityMetrics, type Metric, type QualityVisit } from "./metrics";

// Thresholds: IANS 2016 practice standards, Hillman RJ et al., J Low Genit Tract Dis 2016;20:283-291
// (Hillman RJ et al., J Low Genit Tract Dis 2016): >= 50 HRAs a year; >= 20 HSIL cases; unsatisfactory cytology < 5%;
// cytological HSIL confirmed as histological HSIL >= 90%; HRA under 15 min in > 90%;
// problematic pain or bleeding <= 10% ("problematic" = moderate or severe: our choice).

const byKey = (metrics: Metric[]) => Object.fromEntries(metrics.map((m) => [m.key, m]));

// Invented year for examiner e1: 50 visits, visit i on 2024-01-01 + i weeks, patient p(i mod 25).
function yearOfVisits(): QualityVisit[] {
  const visits: QualityVisit[] = [];
  for (let i = 0; i < 50; i++) {
    const cytology = i % 10 === 0 ? "unsatisfactory" : i % 10 === 1 ? "not_done" : i % 10 === 2 ? "hsil" : "nilm";
    visits.push({
      examinerId: "e1",
      patientId: `p${i % 25}`,
      date: new Date(Date.UTC(2024, 0, 1 + i * 7)),
      cytology,
      cytologyHsilConfirmed: cytology === "hsil" ? i !== 42 : undefined,
      histologyHsil: i < 40 && i % 2 === 0,
      durationMin: i < 40 ? (i % 4 === 0 ? 20 : 10) : null,
      pain: i === 3 || i === 28 ? "moderate" : i === 11 ? "mild" : null,
      bleeding: i === 7 ? "severe" : i === 28 ? "mild" : null,
    });
  }
  // Outside the period or another examiner: must not count for e1 in 2024.
  visits.push({ examinerId: "e1", patientId: "q1", date: "2023-12-31" });
  visits.push({ examinerId: "e1", patientId: "q2", date: "2025-01-01" });
  visits.push({ examinerId: "e2", patientId: "q3", date: "2024-06-01", histologyHsil: true });
  return visits;
}

describe("qualityMetrics for one examiner's year", () => {
  const m = byKey(qualityMetrics({ visits: yearOfVisits(), from: "2024-01-01", to: "2025-01-01", examinerId: "e1" }));

  it("counts HRAs in the period only", () => {
    // 50 visits; the last on day 1 + 49*7 = 344 of 2024 (9 December). 50 >= 50: met.
    expect(m.hra_volume).toMatchObject({ value: 50, met: true });
  });
  it("counts patients, not visits, with histological HSIL", () => {
    // HSIL at even i < 40 (20 visits): patients 0,2,..,24 (13) then i=26..38 -> 1,3,..,13 (7) = 20. Met.
    expect(m.hsil_cases).toMatchObject({ value: 20, met: true });
  });
  it("measures unsatisfactory cytology among smears taken", () => {
    // 5 unsatisfactory (i mod 10 = 0) of 45 smears (5 not done): 11.1% is not < 5%.
    expect(m.unsatisfactory_cytology).toMatchObject({ numerator: 5, denominator: 45, met: false });
    expect(m.unsatisfactory_cytology.value).toBeCloseTo(5 / 45, 10);
  });
  it("measures confirmation of cytological HSIL", () => {
    // HSIL smears at i = 2, 12, 22, 32, 42; i = 42 not confirmed: 4/5 = 80% < 90%.
    expect(m.cytology_hsil_confirmed).toMatchObject({ numerator: 4, denominator: 5, value: 0.8, met: false });
  });
  it("measures HRA duration where timed", () => {
    // Timed for i < 40; 20 min when i mod 4 = 0 (10 visits): 30/40 = 75%, not > 90%.
    expect(m.hra_under_15_min).toMatchObject({ numerator: 30, denominator: 40, value: 0.75, met: false });
  });
  it("counts moderate or severe pain or bleeding once per visit", () => {
    // i=3 moderate pain, i=7 severe bleeding, i=28 moderate pain + mild bleeding, i=11 mild only: 3/50 = 6%.
    expect(m.problematic_pain_or_bleeding).toMatchObject({ numerator: 3, denominator: 50, value: 0.06, met: true });
  });
});

describe("qualityMetrics at the thresholds", () => {
  // 20 invented visits, one a month from January 2024.
  const visits: QualityVisit[] = Array.from({ length: 20 }, (_, i) => ({
    examinerId: "e9",
    patientId: `r${i}`,
    date: addMonths("2024-01-01", i % 12),
    cytology: i === 0 ? "unsatisfactory" : i < 11 ? "hsil" : "nilm",
    cytologyHsilConfirmed: i >= 1 && i < 11 ? i !== 10 : undefined,
    durationMin: i < 18 ? 12 : 16,
    pain: i < 2 ? "severe" : null,
  }));
  const m = byKey(qualityMetrics({ visits, from: "2024-01-01", to: "2025-01-01" }));

  it("treats exactly 5% unsatisfactory as failing (< 5%)", () => {
    expect(m.unsatisfactory_cytology).toMatchObject({ numerator: 1, denominator: 20, met: false });
  });
  it("treats exactly 90% confirmed as meeting (>= 90%)", () => {
    expect(m.cytology_hsil_confirmed).toMatchObject({ numerator: 9, denominator: 10, met: true });
  });
  it("treats exactly 90% under 15 minutes as failing (> 90%)", () => {
    expect(m.hra_under_15_min).toMatchObject({ numerator: 18, denominator: 20, met: false });
  });
  it("treats exactly 10% problematic as meeting (<= 10%)", () => {
    expect(m.problematic_pain_or_bleeding).toMatchObject({ numerator: 2, denominator: 20, met: true });
  });
  it("falls short on volume and cases for a small practice", () => {
    expect(m.hra_volume).toMatchObject({ value: 20, met: false });
    expect(m.hsil_cases).toMatchObject({ value: 0, met: false });
  });
});

describe("qualityMetrics without data", () => {
  it("reports a share as unmeasured rather than met", () => {
    const m = byKey(qualityMetrics({ visits: [], from: "2024-01-01", to: "2025-01-01" }));
    expect(m.hra_under_15_min).toMatchObject({ value: null, met: null });
    expect(m.hra_volume).toMatchObject({ value: 0, met: false });
  });
});
