import { describe, expect, it } from "vitest";
import { matchLesionsToTracks, type NewLesion, type PreviousLesion } from "./matcher";

// No published rule exists for matching lesions between visits; these checks are clock-face
// geometry worked by hand (12 hours = 360°, surgical anatomy texts) and the one-to-one rule of the brief.
const prev = (trackId: string, startH: number, endH: number, d0 = 1, d1 = 2, zone: PreviousLesion["zone"] = "distal_canal"): PreviousLesion => ({
  trackId,
  label: trackId,
  startH,
  endH,
  distStartCm: d0,
  distEndCm: d1,
  zone,
});
const lesion = (lesionId: string, startH: number, endH: number, d0 = 1, d1 = 2, zone: NewLesion["zone"] = "distal_canal"): NewLesion => ({
  lesionId,
  startH,
  endH,
  distStartCm: d0,
  distEndCm: d1,
  zone,
});

describe("matchLesionsToTracks", () => {
  it("matches a lesion straddling 12 o'clock to its twin, not to the neighbour at 1 → 2", () => {
    const r = matchLesionsToTracks([prev("L1", 11.5, 0.5)], [lesion("twin", 11.4, 0.6), lesion("next", 1, 2), lesion("near", 0.3, 1.5)]);
    expect(r.matches.map((m) => [m.trackId, m.lesionId])).toEqual([["L1", "twin"]]);
    expect(r.unmatchedLesionIds).toEqual(["near", "next"]);
  });

  it("explains a match in words: 11.5 → 0.5 lies wholly inside 11.4 → 0.6, same depth and zone", () => {
    const [m] = matchLesionsToTracks([prev("L3", 11.5, 0.5)], [lesion("n1", 11.4, 0.6)]).matches;
    expect(m.explanation).toBe("overlaps 100% of L3's arc, distances overlap 100%, same zone");
  });

  it("lets point-like lesions a quarter hour apart match", () => {
    const r = matchLesionsToTracks([prev("P", 3, 3, 1.5, 1.5)], [lesion("q", 3.25, 3.25, 1.6, 1.6)]);
    expect(r.matches).toHaveLength(1);
  });

  it("does not match the same hour on perianal skin and high in the canal", () => {
    // Perianal skin lies outside the verge (negative distance), AJCC 8th; Sleisenger & Fordtran.
    const r = matchLesionsToTracks([prev("S", 2, 4, -2, -1, "perianal")], [lesion("c", 2, 4, 3, 4, "proximal_canal")]);
    expect(r.matches).toEqual([]);
    expect(r.unmatchedTrackIds).toEqual(["S"]);
    expect(r.unmatchedLesionIds).toEqual(["c"]);
  });

  it("does not match opposite walls at the same depth", () => {
    expect(matchLesionsToTracks([prev("A", 2, 4)], [lesion("b", 8, 10)]).matches).toEqual([]);
  });

  it("assigns one-to-one, maximising the total rather than taking each track's favourite", () => {
    // A = 1 → 5 holds both new lesions, x = 3 → 5 (half of A) and y = 1 → 2 (a quarter of A);
    // B = 4 → 5 meets only x. Taking A's closest fit (x) first would leave B unmatched; the best
    // total pairs A with y and B with x.
    const r = matchLesionsToTracks([prev("A", 1, 5), prev("B", 4, 5)], [lesion("x", 3, 5), lesion("y", 1, 2)]);
    expect(r.matches.map((m) => [m.trackId, m.lesionId])).toEqual([
      ["A", "y"],
      ["B", "x"],
    ]);
  });

  it("honours a configurable minimum score", () => {
    // 2 → 4 against 3 → 5 overlaps half of each arc.
    const tracks = [prev("A", 2, 4)];
    const lesions = [lesion("b", 3, 5)];
    expect(matchLesionsToTracks(tracks, lesions, { minScore: 0.35 }).matches).toHaveLength(1);
    expect(matchLesionsToTracks(tracks, lesions, { minScore: 0.9 }).matches).toHaveLength(0);
  });

  it("refuses duplicate ids", () => {
    expect(() => matchLesionsToTracks([prev("A", 1, 2), prev("A", 3, 4)], [])).toThrow(/duplicate/);
  });
});
