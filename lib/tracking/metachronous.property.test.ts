import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { metachronousFlags, type TrackMarks } from "./patient-summary";

// The metachronous rule as its source states it (Liu Y, Sigel K, Gaisa MM, Papillomavirus Research
// 2018;5:S9: disease in a different region after earlier disease), written the slow way, pair by
// pair: a track is metachronous when some other track had disease strictly before it first
// appeared. metachronousFlags works it out from the two earliest first-disease dates instead.
const day = fc.integer({ min: 0, max: 30 }).map((d) => `2026-01-${String(d + 1).padStart(2, "0")}`);
const marks = fc.record({ firstSeen: fc.option(day, { nil: null }), firstDiseased: fc.option(day, { nil: null }) });

function pairwise(tracks: Map<string, TrackMarks>): Map<string, boolean> {
  const out = new Map<string, boolean>();
  for (const [id, m] of tracks) {
    let earlier = false;
    for (const [other, o] of tracks) if (other !== id && m.firstSeen !== null && o.firstDiseased !== null && o.firstDiseased < m.firstSeen) earlier = true;
    out.set(id, earlier);
  }
  return out;
}

describe("metachronousFlags", () => {
  it("agrees with the pair-by-pair rule on any set of tracks (ties included)", () => {
    fc.assert(
      fc.property(fc.array(marks, { maxLength: 8 }), (list) => {
        const tracks = new Map(list.map((m, i) => [`t${i}`, m]));
        expect(metachronousFlags(tracks)).toEqual(pairwise(tracks));
      }),
      { numRuns: 500 },
    );
  });

  it("does not count a track's own earlier disease", () => {
    // Worked example: one track, diseased at its first sighting and again later: not metachronous.
    expect(metachronousFlags(new Map([["a", { firstSeen: "2026-01-02", firstDiseased: "2026-01-01" }]])).get("a")).toBe(false);
  });
});
