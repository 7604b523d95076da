import { describe, expect, it } from "vitest";
import fc from "fast-check";
import {
  degreesToHours,
  displayHour,
  formatClock,
  hoursToDegrees,
  hoursToRadians,
  normalizeHours,
  snapCm,
  snapHours,
} from "./clock";

describe("normalizeHours", () => {
  it("stores 12 o'clock as 0 and wraps both ways", () => {
    expect(normalizeHours(12)).toBe(0);
    expect(normalizeHours(13)).toBe(1);
    expect(normalizeHours(-1)).toBe(11);
    expect(normalizeHours(-12)).toBe(0);
    expect(normalizeHours(25.5)).toBe(1.5);
  });
  it("never returns 12 for a tiny negative input", () => {
    expect(normalizeHours(-1e-17)).toBeLessThan(12);
  });
  it("rejects non-finite input", () => {
    expect(() => normalizeHours(Number.NaN)).toThrow(RangeError);
    expect(() => normalizeHours(Infinity)).toThrow(RangeError);
  });
  // An in-range value is already normalized, so it must come back bit for bit: a value that
  // drifts by one unit in the last place reads as a moved lesion (a tap once saved 6.29 as
  // 6.289999999999999). The case below is that one; IEEE 754 addition rounds 6.29 + 12.
  it("returns an in-range value exactly as given", () => {
    expect(normalizeHours(6.29)).toBe(6.29);
    expect(normalizeHours(9.709999999999999)).toBe(9.709999999999999);
    expect(Object.is(normalizeHours(-0), 0)).toBe(true);
  });
  it("is the identity on [0, 12) and idempotent everywhere (property)", () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 12, maxExcluded: true, noNaN: true }), (h) => Object.is(normalizeHours(h), h === 0 ? 0 : h)),
    );
    fc.assert(
      fc.property(fc.double({ min: -1e6, max: 1e6, noNaN: true }), (h) => {
        const once = normalizeHours(h);
        return normalizeHours(once) === once;
      }),
    );
  });
  it("always lands in [0, 12) (property)", () => {
    fc.assert(
      fc.property(fc.double({ min: -1e6, max: 1e6, noNaN: true }), (h) => {
        const r = normalizeHours(h);
        return r >= 0 && r < 12;
      }),
    );
  });
});

describe("degrees and radians", () => {
  // 360° / 12 hours = 30° of arc per clock hour (geometry; surgical anatomy texts).
  it("gives 30 degrees per hour", () => {
    expect(hoursToDegrees(1)).toBe(30);
    expect(hoursToDegrees(3)).toBe(90);
    expect(hoursToDegrees(6)).toBe(180);
    expect(hoursToDegrees(12)).toBe(0);
    expect(degreesToHours(270)).toBe(9);
    expect(degreesToHours(-30)).toBe(11);
  });
  // d3-shape arc(): angles in radians, 0 at 12 o'clock, clockwise (d3-shape README, "arc").
  it("gives d3 radians with 3 o'clock at π/2 and 6 at π", () => {
    expect(hoursToRadians(3)).toBeCloseTo(Math.PI / 2, 12);
    expect(hoursToRadians(6)).toBeCloseTo(Math.PI, 12);
    expect(hoursToRadians(0)).toBe(0);
  });
  it("round-trips hours through degrees (property)", () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 11.999, noNaN: true }), (h) => {
        expect(degreesToHours(hoursToDegrees(h))).toBeCloseTo(h, 9);
      }),
    );
  });
});

describe("displayHour", () => {
  // A clock face is read 1..12 with no 0 (convention of clock faces).
  it("shows 12, never 0, and rounds to the nearest hour", () => {
    expect(displayHour(0)).toBe(12);
    expect(displayHour(11.75)).toBe(12);
    expect(displayHour(3)).toBe(3);
    expect(displayHour(6.4)).toBe(6);
    expect(displayHour(6.6)).toBe(7);
  });
});

describe("snapping", () => {
  it("snaps hours to the half-hour grid and wraps 11:50 to 12", () => {
    expect(snapHours(2.8)).toBe(3);
    expect(snapHours(2.6)).toBe(2.5);
    expect(snapHours(11.9)).toBe(0);
    expect(snapHours(4.1, 0.25)).toBe(4);
  });
  it("snaps distances, including perianal negatives, without -0", () => {
    expect(snapCm(1.3)).toBe(1.5);
    expect(snapCm(-2.2)).toBe(-2);
    expect(Object.is(snapCm(-0.1), 0)).toBe(true);
    expect(snapCm(3.04, 0.1)).toBeCloseTo(3, 12);
  });
  it("rejects a non-positive step", () => {
    expect(() => snapHours(1, 0)).toThrow(RangeError);
    expect(() => snapCm(1, -1)).toThrow(RangeError);
  });
});

describe("formatClock", () => {
  it("says o'clock on the hour and h:mm otherwise", () => {
    expect(formatClock(3)).toBe("3 o'clock");
    expect(formatClock(0)).toBe("12 o'clock");
    expect(formatClock(3.5)).toBe("3:30");
    expect(formatClock(0.25)).toBe("12:15");
    expect(formatClock(10.1)).toBe("10:06");
  });
  it("rounds 11:59.9 up to 12 o'clock", () => {
    expect(formatClock(11.9999)).toBe("12 o'clock");
  });
});
