import { describe, expect, it } from "vitest";
import { arcCoverage } from "./coverage";
import { fullCircle, type Arc } from "./arcs";

// Worked by hand on the clock face: arcs run clockwise, 12 hours to the circle, 30° per hour
// (surgical anatomy texts). "Covers" = the treated arcs together reach every hour of the extent.
const arc = (startH: number, endH: number): Arc => ({ startH, endH });

describe("arcCoverage: does a treated arc cover a lesion's clock extent?", () => {
  it("is full when the arc contains the extent, with or without the same ends", () => {
    expect(arcCoverage(arc(2, 4), [arc(2, 4)])).toBe("full");
    expect(arcCoverage(arc(2, 4), [arc(1.5, 4.5)])).toBe("full");
  });
  it("is partial when the arc leaves part of the extent untreated", () => {
    expect(arcCoverage(arc(3, 6), [arc(4, 8)])).toBe("partial"); // 4 → 6 of 3 → 6
    expect(arcCoverage(arc(2, 4), [arc(3, 3.5)])).toBe("partial"); // inside, but shorter
  });
  it("is none when the arc misses or only touches an end", () => {
    expect(arcCoverage(arc(2, 4), [arc(6, 8)])).toBe("none");
    expect(arcCoverage(arc(2, 4), [arc(4, 6)])).toBe("none");
    expect(arcCoverage(arc(2, 4), [])).toBe("none");
  });
  it("reads arcs crossing 12 o'clock clockwise", () => {
    expect(arcCoverage(arc(11, 1), [arc(10, 2)])).toBe("full"); // 10 → 2 passes 12
    expect(arcCoverage(arc(11, 1), [arc(0, 2)])).toBe("partial"); // only 12 → 1 of 11 → 1
    expect(arcCoverage(arc(11, 1), [arc(1, 11)])).toBe("none"); // the long way round, touching both ends
    expect(arcCoverage(arc(11.5, 0.5), [arc(11, 0)])).toBe("partial");
  });
  it("adds arcs that meet: 10 → 12 and 12 → 2 together cover 11 → 1", () => {
    expect(arcCoverage(arc(11, 1), [arc(10, 0), arc(0, 2)])).toBe("full");
    expect(arcCoverage(arc(1, 5), [arc(1, 2), arc(3, 5)])).toBe("partial"); // a gap 2 → 3
  });
  it("reads the whole circumference (0 → 12) as covering everything, and a ring lesion as covered only by a ring", () => {
    expect(arcCoverage(arc(11, 1), [fullCircle()])).toBe("full");
    expect(arcCoverage(fullCircle(), [fullCircle()])).toBe("full");
    expect(arcCoverage(fullCircle(), [arc(0, 6), arc(6, 0)])).toBe("full");
    expect(arcCoverage(fullCircle(), [arc(9, 3)])).toBe("partial");
  });
  it("covers a point lesion when an arc contains its hour", () => {
    expect(arcCoverage(arc(3, 3), [arc(2, 4)])).toBe("full");
    expect(arcCoverage(arc(0, 0), [arc(11, 1)])).toBe("full");
    expect(arcCoverage(arc(6, 6), [arc(2, 4)])).toBe("none");
  });
});
