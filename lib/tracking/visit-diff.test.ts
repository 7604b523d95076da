import { describe, expect, it } from "vitest";
import type { Grade } from "@/lib/domain/vocab";
import { clockShiftH, diffVisits, type DiffLesion } from "./visit-diff";

// Thresholds (1 clock hour, 1 cm) are the product's definition of "moved": common practice, no source.
// Clock facts: 30 degrees per hour, 12 o'clock stored as 0, arcs run clockwise (surgical anatomy texts).

let n = 0;
function lesion(trackId: string | null, grade: Grade, clockStartH: number, clockEndH: number, distanceStartCm = 1, distanceEndCm = 2): DiffLesion {
  n += 1;
  return { id: `l${n}`, trackId, name: trackId ?? `L${n}`, clockStartH, clockEndH, distanceStartCm, distanceEndCm, grade };
}

describe("clockShiftH: the short way round the clock", () => {
  // Worked by hand on a clock face: from 11 to 1 is two hours clockwise, not ten back.
  it("crosses 12 o'clock", () => {
    expect(clockShiftH(11, 1)).toBeCloseTo(2);
    expect(clockShiftH(1, 11)).toBeCloseTo(-2);
    expect(clockShiftH(11.8, 0.2)).toBeCloseTo(0.4);
  });
  it("a half-circle turn is 6 hours either way", () => {
    expect(Math.abs(clockShiftH(3, 9))).toBeCloseTo(6);
  });
});

describe("diffVisits on a worked follow-up", () => {
  // Earlier visit: T1 HSIL 1-3 o'clock, T2 LSIL 6-7, T3 condyloma 9-10.
  // Later visit: T1 HSIL 2-4 (middle 2 -> 3: one hour clockwise), T2 now HSIL (a higher grade),
  // T3 not drawn, T4 HSIL new at 11-12. Expected by hand: new T4, gone T3, grade T2, moved T1.
  const earlier = [lesion("T1", "hsil", 1, 3), lesion("T2", "lsil", 6, 7), lesion("T3", "condyloma", 9, 10)];
  const later = [lesion("T1", "hsil", 2, 4), lesion("T2", "hsil", 6, 7), lesion("T4", "hsil", 11, 0)];
  const diff = diffVisits(earlier, later);

  it("lists each kind once, in the order new, gone, grade, moved", () => {
    expect(diff.map((d) => `${d.kind}:${d.name}`)).toEqual(["new:T4", "gone:T3", "grade:T2", "moved:T1"]);
  });
  it("says the grade went higher in words (LSIL to HSIL is the progression the LAST terms rank)", () => {
    // LAST two tiers: LSIL below HSIL (Darragh TM et al., Arch Pathol Lab Med 2012).
    const g = diff.find((d) => d.kind === "grade")!;
    expect(g.words).toContain("from LSIL to HSIL");
    expect(g.words).toContain("higher");
  });
  it("measures the move as one hour clockwise", () => {
    const m = diff.find((d) => d.kind === "moved")!;
    expect(m.clockShiftH).toBeCloseTo(1);
    expect(m.words).toContain("1 hour");
    expect(m.words).toContain("2 o'clock to 3 o'clock");
  });
  it("describes the gone track with its earlier grade", () => {
    expect(diff.find((d) => d.kind === "gone")!.words).toContain("Condyloma");
  });
});

describe("what counts as moved", () => {
  it("half an hour round the clock and half a cm deeper is not a move", () => {
    expect(diffVisits([lesion("T1", "hsil", 1, 3, 1, 2)], [lesion("T1", "hsil", 1.5, 3.5, 1.5, 2.5)])).toEqual([]);
  });
  it("exactly one hour counts (the rule is at least 1 h)", () => {
    expect(diffVisits([lesion("T1", "hsil", 1, 2)], [lesion("T1", "hsil", 2, 3)]).map((d) => d.kind)).toEqual(["moved"]);
  });
  it("near 12 o'clock: middles at 11:48 and 0:12 are 24 minutes apart, not a move", () => {
    // 11.3-12.3 has its middle at 11.8; 11.7-0.7 at 0.2 (both cross 12 o'clock).
    expect(diffVisits([lesion("T1", "lsil", 11.3, 0.3)], [lesion("T1", "lsil", 11.7, 0.7)])).toEqual([]);
  });
  it("an arc across 12 o'clock moving one hour anticlockwise is a move of -1 h", () => {
    // 11:30-0:30 (middle 12) to 10:30-11:30 (middle 11).
    const [m] = diffVisits([lesion("T1", "hsil", 11.5, 0.5)], [lesion("T1", "hsil", 10.5, 11.5)]);
    expect(m!.kind).toBe("moved");
    expect(m!.clockShiftH).toBeCloseTo(-1);
  });
  it("one cm deeper (middle 1.5 cm to 2.5 cm) is a move in distance only", () => {
    const [m] = diffVisits([lesion("T1", "hsil", 1, 2, 1, 2)], [lesion("T1", "hsil", 1, 2, 2, 3)]);
    expect(m!.distanceShiftCm).toBeCloseTo(1);
    expect(m!.words).toContain("1 cm deeper");
    expect(m!.words).not.toContain("round the clock");
  });
  it("a track that changed grade and moved gives two entries", () => {
    expect(diffVisits([lesion("T1", "lsil", 1, 2)], [lesion("T1", "hsil", 4, 5)]).map((d) => d.kind)).toEqual(["grade", "moved"]);
  });
});

describe("words follow the display convention", () => {
  // Prone jack-knife turns the face half a circle: lithotomy 3 o'clock reads 9 o'clock
  // (surgical anatomy texts, derived, from memory).
  it("a move from stored 2 to stored 3 o'clock reads 8 to 9 o'clock in prone jack-knife", () => {
    const [m] = diffVisits([lesion("T1", "hsil", 1.5, 2.5)], [lesion("T1", "hsil", 2.5, 3.5)], { convention: "prone_jackknife" });
    expect(m!.words).toContain("8 o'clock to 9 o'clock");
  });
});

describe("identity", () => {
  it("a lesion without a track is its own identity: new, never matched by place", () => {
    const diff = diffVisits([lesion("T1", "hsil", 1, 2)], [lesion("T1", "hsil", 1, 2), lesion(null, "hsil", 1, 2)]);
    expect(diff.map((d) => d.kind)).toEqual(["new"]);
  });
  it("a track absent at the earlier visit but seen before it is back, not new in words", () => {
    // Cleared then found again at the treated site = recurrent (Liu Y et al., Papillomavirus Res 2018, common practice).
    const [d] = diffVisits([], [lesion("T2", "hsil", 2, 5)], { seenBeforeEarlier: new Set(["T2"]) });
    expect(d!.kind).toBe("new");
    expect(d!.words).toContain("T2 is back");
    expect(d!.words).not.toContain("is new");
  });
  it("a track marked not found at the later visit says so", () => {
    const [g] = diffVisits([lesion("T1", "hsil", 1, 2)], [], { laterChecks: { T1: "not_found" } });
    expect(g!.words).toContain("looked for and not found");
  });
  it("identical visits have no differences", () => {
    const a = [lesion("T1", "hsil", 1, 2), lesion("T2", "lsil", 5, 6)];
    expect(diffVisits(a, a.map((l) => ({ ...l, id: `${l.id}b` })))).toEqual([]);
  });
});
