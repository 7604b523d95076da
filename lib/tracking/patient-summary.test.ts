import { describe, expect, it } from "vitest";
import type { Grade, Histology } from "@/lib/domain/vocab";
import { summarizePatient, withMetachronousContext, type TrackHistory } from "./patient-summary";
import type { TrackObservation } from "./status";

// One invented patient, three visits, three tracks.
const visits = ["2023-01-10", "2023-07-10", "2024-01-10"];
type Cell = "-" | "x" | Grade | [Grade, Histology] | [Grade, "treated"];
function history(trackId: string, cells: Cell[]): TrackHistory {
  const observations: TrackObservation[] = cells.map((c, i) => {
    const base = { visitId: `v${i}`, visitDate: visits[i], treatedAtVisit: false, lookedFor: true };
    if (c === "-") return { ...base, seen: false, lookedFor: false };
    if (c === "x") return { ...base, seen: false };
    if (typeof c === "string") return { ...base, seen: true, impressionGrade: c };
    if (c[1] === "treated") return { ...base, seen: true, impressionGrade: c[0], treatedAtVisit: true };
    return { ...base, seen: true, impressionGrade: c[0], histology: c[1] };
  });
  return { trackId, observations };
}

describe("summarizePatient", () => {
  // A: treated HSIL, clear, then found again → recurrent (common practice, no single source; Liu Y et al., Papillomavirus Res 2018).
  // B: appears at visit 2 at another site after A's HSIL → new, metachronous (Liu 2018, Papillomavirus Res 5:S9),
  //    then LSIL with HSIL histology at visit 3 → persistent (same grade HSIL, histology deciding, LAST 2012).
  // C: untreated LSIL not found at visit 3 → regressed.
  const tracks = [
    history("A", [["hsil", "treated"], "x", "hsil"]),
    history("B", ["-", "hsil", ["lsil", "hsil"]]),
    history("C", ["-", "lsil", "x"]),
  ];
  const summary = summarizePatient(tracks);

  it("counts tracks by their current status", () => {
    expect(summary.countsByStatus).toEqual({ new: 0, persistent: 1, regressed: 1, progressed: 0, cleared: 0, recurrent: 1 });
  });
  it("flags B as metachronous because A had disease before B appeared", () => {
    expect(summary.statusesByTrack.B[1].reason).toContain("metachronous");
    expect(summary.statusesByTrack.A[0].reason).not.toContain("metachronous");
  });
  it("dates the last HSIL-or-worse finding, counting histology", () => {
    expect(summary.lastHsilOrWorseDate).toBe("2024-01-10");
  });
  it("lists treated tracks", () => {
    expect(summary.treatedTracks).toEqual([{ trackId: "A", label: undefined, lastTreatedDate: "2023-01-10" }]);
  });
});

describe("withMetachronousContext", () => {
  it("does not call same-day lesions metachronous (they are found together, not after)", () => {
    const [a, b] = withMetachronousContext([history("A", ["hsil", "hsil", "hsil"]), history("B", ["lsil", "lsil", "lsil"])]);
    expect(a.earlierDiseaseElsewhere).toBe(false);
    expect(b.earlierDiseaseElsewhere).toBe(false);
  });
  it("ignores earlier benign findings elsewhere (benign is not disease)", () => {
    const [, b] = withMetachronousContext([history("A", ["benign", "x", "x"]), history("B", ["-", "-", "hsil"])]);
    expect(b.earlierDiseaseElsewhere).toBe(false);
  });
});
