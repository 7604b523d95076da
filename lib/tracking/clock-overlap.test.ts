import { describe, expect, it } from "vitest";
import { arcLengthH, compareArcs, normalizeHour, overlapLengthH, rotateArc, widenArc } from "./clock-overlap";

// Clock-face geometry: 12 hours make a full turn, 30° of arc per hour (surgical anatomy texts). Expected
// values below are worked out by hand on a drawn clock face.
describe("clock arcs", () => {
  it("measures arcs clockwise, across 12 o'clock too", () => {
    expect(arcLengthH({ startH: 11.5, endH: 0.5 })).toBe(1); // 30° either side of 12 → 60° → 2 × 30°
    expect(arcLengthH({ startH: 3, endH: 9 })).toBe(6); // left to right through 6 o'clock: half the circle
    expect(arcLengthH({ startH: 9, endH: 3 })).toBe(6); // the other half, through 12
    expect(arcLengthH({ startH: 4, endH: 4 })).toBe(0); // a point
    expect(arcLengthH({ startH: 0, endH: 12 })).toBe(12); // the whole circumference
  });

  it("wraps hours into [0, 12)", () => {
    expect(normalizeHour(-1)).toBe(11);
    expect(normalizeHour(12)).toBe(0);
    expect(normalizeHour(25.5)).toBe(1.5);
  });

  it("finds overlap across 12 o'clock", () => {
    const a = { startH: 11, lengthH: 2 }; // 11 → 1
    expect(overlapLengthH(a, { startH: 0, lengthH: 2 })).toBe(1); // 0 → 2 shares 12 → 1
    expect(overlapLengthH(a, { startH: 1, lengthH: 1 })).toBe(0); // 1 → 2 only touches
    expect(overlapLengthH(a, { startH: 10.5, lengthH: 1 })).toBe(0.5); // 10.5 → 11.5 shares 11 → 11.5
    // An arc through 12 meeting another at both of its ends: 10 → 2 and 1 → 11 share 10–11 and 1–2.
    expect(overlapLengthH({ startH: 10, lengthH: 4 }, { startH: 1, lengthH: 10 })).toBe(2);
  });

  it("widens point-like arcs about their middle", () => {
    expect(widenArc({ startH: 6, endH: 6 }, 0.5)).toEqual({ startH: 5.75, lengthH: 0.5 });
    expect(widenArc({ startH: 0, endH: 0 }, 0.5)).toEqual({ startH: 11.75, lengthH: 0.5 });
    // Two point lesions 0.25 h apart: widened arcs 5.75–6.25 and 6–6.5 share 0.25 h.
    expect(compareArcs({ startH: 6, endH: 6 }, { startH: 6.25, endH: 6.25 }).overlapH).toBe(0.25);
  });

  it("keeps a ring a ring when rotated", () => {
    expect(arcLengthH(rotateArc({ startH: 0, endH: 12 }, 3))).toBe(12);
    expect(rotateArc({ startH: 11, endH: 1 }, 2)).toEqual({ startH: 1, endH: 3 });
  });
});
