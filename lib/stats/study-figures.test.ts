import { describe, expect, it } from "vitest";
import { kaplanMeier } from "./kaplan-meier";
import { rateAt, withEmptyQuarters } from "./study-figures";

// 6-MP arm of the Freireich 1963 remission trial (Kleinbaum & Klein's table; recalled from memory,
// recomputed by hand): 21 patients, + = censored. At week 10, 15 are still at risk and S(10) = 0.753.
const SIX_MP = [6, 6, 6, -6, 7, -9, 10, -10, -11, 13, 16, -17, -19, -20, 22, 23, -25, -32, -32, -34, -35]
  .map((t) => ({ time: Math.abs(t), event: t > 0 }));

describe("a survival rate on the study page", () => {
  it("prints the rate with the number at risk when enough remain", () => {
    const r = rateAt(kaplanMeier(SIX_MP), 10);
    expect(r.atRisk).toBe(15);
    expect(r.rate).toBeCloseTo(0.753, 3);
  });

  it("suppresses the rate when fewer than the minimum are still followed (2 at risk, no follow-up)", () => {
    // Two patients cleared 30 and 40 days ago: nobody has been followed to a year.
    const r = rateAt(kaplanMeier([{ time: 30, event: false }, { time: 40, event: false }]), 365);
    expect(r).toEqual({ atRisk: 0, rate: null });
    // At week 23 the 6-MP arm has 6 at risk (Kleinbaum & Klein): under the minimum of 10.
    expect(rateAt(kaplanMeier(SIX_MP), 23)).toEqual({ atRisk: 6, rate: null });
  });
});

describe("quarters on the grade chart", () => {
  it("keeps the quarters without data and names them", () => {
    const zero = (quarter: string) => ({ quarter, n: 0 });
    const out = withEmptyQuarters([{ quarter: "2024 Q4", n: 3 }, { quarter: "2025 Q3", n: 1 }], zero);
    expect(out.rows.map((r) => r.quarter)).toEqual(["2024 Q4", "2025 Q1", "2025 Q2", "2025 Q3"]);
    expect(out.empty).toEqual(["2025 Q1", "2025 Q2"]);
    expect(out.rows[1]).toEqual({ quarter: "2025 Q1", n: 0 });
  });
});
