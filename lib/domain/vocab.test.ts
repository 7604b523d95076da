import { describe, expect, it } from "vitest";
import { GRADE_RANK, HISTOLOGY, HISTOLOGY_AS_GRADE } from "./vocab";

describe("grade vocabulary", () => {
  // LAST (Darragh TM et al., Arch Pathol Lab Med 2012): two tiers, LSIL below HSIL.
  it("ranks HSIL above LSIL and cancer above HSIL", () => {
    expect(GRADE_RANK.hsil).toBeGreaterThan(GRADE_RANK.lsil);
    expect(GRADE_RANK.suspected_cancer).toBeGreaterThan(GRADE_RANK.hsil);
  });
  it("maps every histology result onto an impression grade", () => {
    for (const h of HISTOLOGY) expect(HISTOLOGY_AS_GRADE[h]).toBeDefined();
    expect(HISTOLOGY_AS_GRADE.hsil).toBe("hsil");
  });
});
