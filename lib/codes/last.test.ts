import { describe, expect, it } from "vitest";
import { ainLabel, lastFromAin } from "./last";

// LAST: Darragh TM et al., Arch Pathol Lab Med 2012;136:1266-97 (Hillman RJ et al., J Low Genit Tract Dis 2016).
describe("lastFromAin", () => {
  it("maps AIN1 to LSIL and AIN3 to HSIL whatever the stain", () => {
    for (const p16 of ["block_positive", "negative", "not_block", "not_done"] as const) {
      expect(lastFromAin("ain1", p16)).toBe("lsil");
      expect(lastFromAin("ain3", p16)).toBe("hsil");
    }
  });
  it("lets p16 decide AIN2: block positive HSIL, negative or not block LSIL", () => {
    expect(lastFromAin("ain2", "block_positive")).toBe("hsil");
    expect(lastFromAin("ain2", "negative")).toBe("lsil");
    expect(lastFromAin("ain2", "not_block")).toBe("lsil");
  });
  it("keeps unstained AIN2 in the HSIL tier", () => {
    // From memory of LAST: morphological -IN2 sits in HSIL; p16 is what moves it down.
    expect(lastFromAin("ain2", "not_done")).toBe("hsil");
  });
  it("labels the tier first and the qualifier after", () => {
    expect(ainLabel("ain2", "negative")).toBe("LSIL (AIN2, p16 negative)");
    expect(ainLabel("ain3")).toBe("HSIL (AIN3)");
  });
});
