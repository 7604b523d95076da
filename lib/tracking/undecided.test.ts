import { describe, expect, it } from "vitest";
import { undecidedMessage, undecidedTracks } from "./undecided";

// Rule (common practice, no source): an earlier lesion is looked for again at each follow-up, and
// only an explicit decision (found, not found, treated, not examined) settles it for that visit.
describe("undecided earlier tracks", () => {
  const earlier = [
    { trackId: "a", label: "#10" },
    { trackId: "b", label: "#2" },
    { trackId: "c", label: "#1" },
    { trackId: "d", label: "#3" },
    { trackId: "b", label: "#2" },
  ];
  it("leaves out tracks found here or marked here, once each, in label order", () => {
    const out = undecidedTracks(earlier, ["d", null], [{ trackId: "c", outcome: "not_examined" }]);
    expect(out.map((t) => t.label)).toEqual(["#2", "#10"]);
  });
  it("counts every kind of mark as a decision, not-examined included", () => {
    expect(undecidedTracks(earlier, [], [
      { trackId: "a", outcome: "not_found" }, { trackId: "b", outcome: "treated" }, { trackId: "c", outcome: "not_examined" }, { trackId: "d", outcome: "not_found" },
    ])).toEqual([]);
  });
  it("names the tracks and the three answers", () => {
    expect(undecidedMessage(["#1", "#3"])).toMatch(/\(#1, #3\): found, not found or not examined/);
    expect(undecidedMessage(["#1"])).toMatch(/It is not counted as clear/);
  });
});
