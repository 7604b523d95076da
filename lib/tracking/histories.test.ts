import { describe, expect, it } from "vitest";
import { worstHistology, worstHistologyByLesion } from "./histories";

// Several biopsies of one lesion: the most severe result decides its grade (LAST, Darragh 2012:
// the lesion is classified by its highest-grade area; common practice for a multi-biopsy lesion).
describe("worst histology", () => {
  it("takes the most severe result, whatever the order, and ignores missing results", () => {
    expect(worstHistology(["benign", "hsil", "lsil"])).toBe("hsil");
    expect(worstHistology(["lsil", null, "benign"])).toBe("lsil");
    expect(worstHistology(["hsil", "scc"])).toBe("scc");
    expect(worstHistology([null, undefined])).toBeNull();
    expect(worstHistology([])).toBeNull();
  });
  it("per lesion, skipping biopsies away from a mapped lesion", () => {
    const m = worstHistologyByLesion([
      { lesionId: "a", histology: "lsil" }, { lesionId: "a", histology: "hsil" }, { lesionId: "b", histology: "benign" },
      { lesionId: null, histology: "scc" }, { lesionId: "b", histology: null },
    ]);
    expect([...m.entries()]).toEqual([["a", "hsil"], ["b", "benign"]]);
  });
});
