import { describe, expect, it } from "vitest";
import { fullCircle, type Arc } from "@/lib/geometry/arcs";
import { assessExtent, treatedFraction } from "./extent";

const arc = (startH: number, endH: number): Arc => ({ startH, endH });

// Check values are clock geometry worked by hand (12 hours to the circle). The 0.5 caution
// threshold is from memory, unverified (Pineda CE et al., J Gastrointest Surg 2007; staged treatment for circumferential
// disease: Pineda CE et al., J Gastrointest Surg 2007).
describe("treatedFraction", () => {
  it("counts overlapping treated arcs once, across 12 o'clock", () => {
    // 10→2 plus 1→4 = 10→4 = 6 h = half the circle.
    expect(treatedFraction([arc(10, 2), arc(1, 4)])).toBe(0.5);
    // 11→1 is 2 h, not 10 h.
    expect(treatedFraction([arc(11, 1)])).toBeCloseTo(2 / 12, 12);
    expect(treatedFraction([])).toBe(0);
    expect(treatedFraction([fullCircle()])).toBe(1);
  });
});

describe("assessExtent", () => {
  it("cautions at the half-circumference threshold itself", () => {
    const result = assessExtent([arc(10, 2), arc(1, 4)]);
    expect(result.fraction).toBe(0.5);
    expect(result.level).toBe("caution");
    expect(result.message).toMatch(/50%/);
    expect(result.message).toMatch(/6 of 12/);
  });
  it("is ok below the threshold", () => {
    // 3→6 = 3 h = 25 %.
    const result = assessExtent([arc(3, 6)]);
    expect(result.level).toBe("ok");
    expect(result.message).toMatch(/25%/);
  });
  it("follows a configured threshold", () => {
    // 11→2 = 3 h = 25 %: caution at a 0.25 threshold, ok at 0.3.
    expect(assessExtent([arc(11, 2)], 0.25).level).toBe("caution");
    expect(assessExtent([arc(11, 2)], 0.3).level).toBe("ok");
    expect(() => assessExtent([arc(1, 2)], 0)).toThrow(RangeError);
    expect(() => assessExtent([arc(1, 2)], 1.5)).toThrow(RangeError);
  });
  it("cautions for a full-circle treatment", () => {
    expect(assessExtent([fullCircle()]).level).toBe("caution");
  });
});
