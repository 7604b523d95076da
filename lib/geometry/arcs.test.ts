import { describe, expect, it } from "vitest";
import fc from "fast-check";
import {
  arcLengthH,
  arcMidpointH,
  arcToRadians,
  containsHour,
  fractionOfCircumference,
  fullCircle,
  isFullCircle,
  overlapH,
  rotateArc,
  unionArcs,
  unionLengthH,
  type Arc,
} from "./arcs";

// Check values in this file are clock-face geometry worked by hand: arcs run clockwise,
// 12 hours to the circle (surgical anatomy texts).
const arc = (startH: number, endH: number): Arc => ({ startH, endH });

describe("arcLengthH and containsHour", () => {
  it("measures clockwise, across 12 o'clock", () => {
    expect(arcLengthH(arc(11, 1))).toBe(2);
    expect(arcLengthH(arc(1, 11))).toBe(10);
    expect(arcLengthH(arc(3, 3))).toBe(0);
    expect(arcLengthH(fullCircle())).toBe(12);
  });
  it("contains its ends and the hours between, clockwise", () => {
    expect(containsHour(arc(11, 1), 0)).toBe(true);
    expect(containsHour(arc(11, 1), 11)).toBe(true);
    expect(containsHour(arc(11, 1), 1)).toBe(true);
    expect(containsHour(arc(11, 1), 6)).toBe(false);
    expect(containsHour(arc(3, 3), 3)).toBe(true);
    expect(containsHour(arc(3, 3), 4)).toBe(false);
    expect(containsHour(fullCircle(), 7)).toBe(true);
  });
});

describe("overlapH", () => {
  it("overlaps 11→1 and 12:30→2 by half an hour", () => {
    expect(overlapH(arc(11, 1), arc(0.5, 2))).toBeCloseTo(0.5, 12);
  });
  it("adds both pieces when two arcs share two separate stretches", () => {
    // 10→4 and 2→12 share 10→12 and 2→4.
    expect(overlapH(arc(10, 4), arc(2, 0))).toBe(4);
  });
  it("is zero for disjoint or merely touching arcs, and the shorter length when nested", () => {
    expect(overlapH(arc(1, 2), arc(3, 4))).toBe(0);
    expect(overlapH(arc(1, 3), arc(3, 5))).toBe(0);
    expect(overlapH(arc(10, 4), arc(11, 1))).toBe(2);
    expect(overlapH(fullCircle(), arc(5, 8))).toBe(3);
  });
});

describe("unionArcs", () => {
  it("joins 10→2 and 1→4 into 10→4 (6 h)", () => {
    expect(unionArcs([arc(10, 2), arc(1, 4)])).toEqual([arc(10, 4)]);
    expect(unionLengthH([arc(10, 2), arc(1, 4)])).toBe(6);
  });
  it("joins arcs that meet at 12 o'clock and keeps gaps", () => {
    expect(unionArcs([arc(10, 0), arc(0, 2), arc(5, 6)])).toEqual([arc(5, 6), arc(10, 2)]);
  });
  it("recognises a full circle made of pieces", () => {
    expect(unionArcs([arc(0, 6), arc(6, 0)])).toEqual([fullCircle()]);
    expect(fractionOfCircumference([arc(2, 9), arc(8, 3)])).toBe(1);
  });
  it("returns nothing for nothing", () => {
    expect(unionArcs([])).toEqual([]);
    expect(fractionOfCircumference([])).toBe(0);
  });
  it("gives a quarter circle for 3 hours", () => {
    expect(fractionOfCircumference([arc(1, 2), arc(1.5, 4)])).toBe(0.25);
  });
});

describe("rotateArc, arcMidpointH, arcToRadians", () => {
  it("rotates both ends and wraps", () => {
    expect(rotateArc(arc(11, 1), 6)).toEqual(arc(5, 7));
    expect(rotateArc(arc(1, 2), -3)).toEqual(arc(10, 11));
    expect(rotateArc(fullCircle(), 2)).toEqual(fullCircle());
  });
  it("finds the midpoint clockwise, across 12 o'clock", () => {
    expect(arcMidpointH(arc(11, 1))).toBe(0);
    expect(arcMidpointH(arc(10, 4))).toBe(1);
    expect(arcMidpointH(arc(2, 2))).toBe(2);
  });
  // d3-shape arc(): radians, 0 at 12 o'clock, clockwise (d3-shape README, "arc").
  it("gives d3 angles that draw 11→1 the short way", () => {
    const { startAngle, endAngle } = arcToRadians(arc(11, 1));
    expect(startAngle).toBeCloseTo((11 * Math.PI) / 6, 12);
    expect(endAngle - startAngle).toBeCloseTo(Math.PI / 3, 12);
  });
});

// Properties. Arcs are drawn on a 1/8-hour grid so that sums are exact in binary
// floating point; the editor snaps to half hours, so this is the real domain.
const gridHour = fc.integer({ min: 0, max: 95 }).map((n) => n / 8);
const gridArc = fc.record({ startH: gridHour, endH: gridHour });
const anyArc = fc.record({
  startH: fc.double({ min: 0, max: 11.999, noNaN: true }),
  endH: fc.double({ min: 0, max: 11.999, noNaN: true }),
});

describe("arc properties", () => {
  it("overlap is symmetric", () => {
    fc.assert(
      fc.property(anyArc, anyArc, (a, b) => {
        expect(overlapH(a, b)).toBeCloseTo(overlapH(b, a), 9);
      }),
    );
  });
  it("overlap is no longer than either arc and an arc overlaps itself fully", () => {
    fc.assert(
      fc.property(anyArc, anyArc, (a, b) => {
        const o = overlapH(a, b);
        expect(o).toBeLessThanOrEqual(Math.min(arcLengthH(a), arcLengthH(b)) + 1e-9);
        expect(overlapH(a, a)).toBeCloseTo(arcLengthH(a), 9);
      }),
    );
  });
  it("overlap and union length do not change when everything is rotated together", () => {
    fc.assert(
      fc.property(fc.array(gridArc, { minLength: 1, maxLength: 6 }), gridHour, (arcs, dh) => {
        const turned = arcs.map((a) => rotateArc(a, dh));
        expect(overlapH(turned[0], turned[turned.length - 1])).toBe(overlapH(arcs[0], arcs[arcs.length - 1]));
        expect(unionLengthH(turned)).toBe(unionLengthH(arcs));
      }),
    );
  });
  it("union length lies between the longest arc and the sum of lengths", () => {
    fc.assert(
      fc.property(fc.array(anyArc, { minLength: 1, maxLength: 6 }), (arcs) => {
        const lengths = arcs.map(arcLengthH);
        const u = unionLengthH(arcs);
        expect(u).toBeLessThanOrEqual(lengths.reduce((s, l) => s + l, 0) + 1e-9);
        expect(u).toBeGreaterThanOrEqual(Math.max(...lengths) - 1e-9);
      }),
    );
  });
  it("union pieces are disjoint and cover every input hour", () => {
    fc.assert(
      fc.property(fc.array(gridArc, { minLength: 1, maxLength: 6 }), (arcs) => {
        const union = unionArcs(arcs);
        for (let i = 0; i < union.length; i++) {
          for (let j = i + 1; j < union.length; j++) expect(overlapH(union[i], union[j])).toBe(0);
        }
        for (const a of arcs) {
          expect(union.some((u) => containsHour(u, a.startH) && containsHour(u, arcMidpointH(a)))).toBe(true);
        }
      }),
    );
  });
  it("fraction of circumference stays in [0, 1]", () => {
    fc.assert(
      fc.property(fc.array(anyArc, { maxLength: 8 }), (arcs) => {
        const f = fractionOfCircumference(arcs);
        return f >= 0 && f <= 1;
      }),
    );
  });
});

// The whole circumference is written 0 → 12 (the only arc whose end is a whole turn past its
// start). Full circle = 12 clock hours = 360° = 100 % of the circumference (geometry).
describe("the full circle written 0 → 12", () => {
  const ring = arc(0, 12);
  it("is 12 hours long, 100 % of the circumference, not a point", () => {
    expect(isFullCircle(ring)).toBe(true);
    expect(arcLengthH(ring)).toBe(12);
    expect(fractionOfCircumference([ring])).toBe(1);
    expect(unionArcs([ring, arc(3, 5)])).toEqual([ring]);
  });
  it("contains every hour and overlaps any arc by that arc's length", () => {
    expect(containsHour(ring, 6)).toBe(true);
    expect(overlapH(ring, arc(11, 1))).toBe(2);
  });
  it("is drawn as the whole turn (2π for d3-shape) and stays a ring when turned", () => {
    const { startAngle, endAngle } = arcToRadians(ring);
    expect(endAngle - startAngle).toBeCloseTo(2 * Math.PI, 12);
    expect(arcLengthH(rotateArc(ring, 6))).toBe(12);
  });
  it("keeps a point a point: start = end is 0 % (3 → 3), and 12 → 0 is a point too", () => {
    expect(arcLengthH(arc(3, 3))).toBe(0);
    expect(isFullCircle(arc(12, 0))).toBe(false);
    expect(fractionOfCircumference([arc(0, 0)])).toBe(0);
  });
});
