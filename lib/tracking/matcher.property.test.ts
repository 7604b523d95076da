import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { ZONES } from "@/lib/domain/vocab";
import { normalizeHour } from "./clock-overlap";
import { scorePair } from "./match-score";
import { matchLesionsToTracks, type NewLesion, type PreviousLesion } from "./matcher";

// Properties that follow from clock-face geometry (a full turn is 12 hours, surgical anatomy texts): turning
// or mirroring the whole picture, or listing it in another order, cannot change which lesion is
// which. Hours and centimetres are drawn on a quarter grid, which binary floats hold exactly.
const quarterHour = fc.integer({ min: 0, max: 47 }).map((q) => q / 4);
const place = fc.record({
  startH: quarterHour,
  lengthQ: fc.integer({ min: 0, max: 16 }),
  distStartCm: fc.integer({ min: -12, max: 24 }).map((q) => q / 4),
  rangeQ: fc.integer({ min: 0, max: 8 }),
  zone: fc.constantFrom(...ZONES),
});
type Place = { startH: number; lengthQ: number; distStartCm: number; rangeQ: number; zone: (typeof ZONES)[number] };
const shape = (p: Place) => ({
  startH: p.startH,
  endH: normalizeHour(p.startH + p.lengthQ / 4),
  distStartCm: p.distStartCm,
  distEndCm: p.distStartCm + p.rangeQ / 4,
  zone: p.zone,
});
const visitPair = fc.record({
  previous: fc.array(place, { maxLength: 6 }).map((ps) => ps.map((p, i): PreviousLesion => ({ trackId: `T${i}`, label: `L${i}`, ...shape(p) }))),
  current: fc.array(place, { maxLength: 6 }).map((ps) => ps.map((p, i): NewLesion => ({ lesionId: `N${i}`, ...shape(p) }))),
});
const rotate = <T extends { startH: number; endH: number }>(x: T, byH: number): T => ({
  ...x,
  startH: normalizeHour(x.startH + byH),
  endH: normalizeHour(x.endH + byH),
});
// Mirror image left ↔ right: a clockwise arc s → e becomes (12 − e) → (12 − s).
const mirror = <T extends { startH: number; endH: number }>(x: T): T => ({
  ...x,
  startH: normalizeHour(12 - x.endH),
  endH: normalizeHour(12 - x.startH),
});
const pairs = (r: ReturnType<typeof matchLesionsToTracks>) => r.matches.map((m) => [m.trackId, m.lesionId, m.score]);

describe("matcher properties", () => {
  it("gives the same matching when every lesion of both visits turns by the same angle", () => {
    fc.assert(
      fc.property(visitPair, quarterHour, ({ previous, current }, byH) => {
        const turned = matchLesionsToTracks(previous.map((p) => rotate(p, byH)), current.map((c) => rotate(c, byH)));
        expect(turned).toEqual(matchLesionsToTracks(previous, current));
      }),
    );
  });

  it("gives the same matching for the mirror image", () => {
    fc.assert(
      fc.property(visitPair, ({ previous, current }) => {
        expect(pairs(matchLesionsToTracks(previous.map(mirror), current.map(mirror)))).toEqual(pairs(matchLesionsToTracks(previous, current)));
      }),
    );
  });

  it("gives the same matching whatever order the lesions are listed in", () => {
    const shuffled = visitPair.chain(({ previous, current }) =>
      fc.tuple(
        fc.constant({ previous, current }),
        fc.shuffledSubarray(previous, { minLength: previous.length }),
        fc.shuffledSubarray(current, { minLength: current.length }),
      ),
    );
    fc.assert(
      fc.property(shuffled, ([original, previous, current]) => {
        expect(matchLesionsToTracks(previous, current)).toEqual(matchLesionsToTracks(original.previous, original.current));
      }),
    );
  });

  it("scores pairs symmetrically, within [0, 1], and a lesion against itself as 1", () => {
    fc.assert(
      fc.property(place, place, (a, b) => {
        const [x, y] = [shape(a), shape(b)];
        expect(scorePair(x, y).score).toBe(scorePair(y, x).score);
        expect(scorePair(x, y).score).toBeGreaterThanOrEqual(0);
        expect(scorePair(x, y).score).toBeLessThanOrEqual(1);
        expect(scorePair(x, x).score).toBeCloseTo(1, 12);
      }),
    );
  });

  it("keeps the twin across 12 o'clock at any rotation", () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 12, noNaN: true }), (byH) => {
        const r = matchLesionsToTracks(
          [rotate({ trackId: "T", label: "L1", startH: 11.5, endH: 0.5, distStartCm: 1, distEndCm: 2, zone: "distal_canal" as const }, byH)],
          [
            rotate({ lesionId: "twin", startH: 11.4, endH: 0.6, distStartCm: 1, distEndCm: 2, zone: "distal_canal" as const }, byH),
            rotate({ lesionId: "next", startH: 1, endH: 2, distStartCm: 1, distEndCm: 2, zone: "distal_canal" as const }, byH),
          ],
        );
        expect(r.matches.map((m) => m.lesionId)).toEqual(["twin"]);
      }),
    );
  });

  // Checked against brute force over every one-to-one assignment (small cases only).
  it("finds a matching with the largest total score above the threshold", () => {
    const small = fc.record({
      previous: fc.array(place, { maxLength: 4 }).map((ps) => ps.map((p, i): PreviousLesion => ({ trackId: `T${i}`, label: `L${i}`, ...shape(p) }))),
      current: fc.array(place, { maxLength: 4 }).map((ps) => ps.map((p, i): NewLesion => ({ lesionId: `N${i}`, ...shape(p) }))),
    });
    fc.assert(
      fc.property(small, ({ previous, current }) => {
        const got = matchLesionsToTracks(previous, current).matches.reduce((s, m) => s + m.score, 0);
        const value = (t: PreviousLesion, l: NewLesion) => {
          const s = Math.round(scorePair(t, l).score * 1e6) / 1e6;
          return s >= 0.35 ? s : 0;
        };
        const best = (i: number, used: Set<number>): number => {
          if (i === previous.length) return 0;
          let top = best(i + 1, used); // track i left unmatched
          current.forEach((l, j) => {
            if (used.has(j)) return;
            used.add(j);
            top = Math.max(top, value(previous[i], l) + best(i + 1, used));
            used.delete(j);
          });
          return top;
        };
        expect(got).toBeCloseTo(best(0, new Set()), 6);
      }),
    );
  });
});
