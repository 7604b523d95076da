import { describe, expect, it } from "vitest";
import { render } from "@testing-library/react";
import { GRADES } from "@/lib/domain/vocab";
import { MODALITY_WORDS } from "@/lib/domain/labels";
import { GradePattern } from "./patterns";

// HRA impression features (Jay N et al., Dis Colon Rectum 1997): punctation is drawn as dots and
// mosaic as a grid of crossing lines. Dentate records vessels separately, so a grade fill must be
// neither: no dots, and the lines of one fill all run one way.
function patternOf(grade: (typeof GRADES)[number]) {
  const { container } = render(<svg><defs><GradePattern id="p" grade={grade} /></defs></svg>);
  return container.querySelector("pattern")!;
}

describe("grade fills", () => {
  it.each(GRADES)("the %s fill has no dots and no crossing lines", (grade) => {
    const p = patternOf(grade);
    expect(p.querySelectorAll("circle, ellipse")).toHaveLength(0);
    const directions = new Set([...p.querySelectorAll("line")].map((l) => (l.getAttribute("y1") === l.getAttribute("y2") ? "along" : "across")));
    expect(directions.size).toBeLessThanOrEqual(1);
  });

  it("gives every grade a different texture, so a greyscale print tells them apart", () => {
    const keys = GRADES.map((g) => {
      const p = patternOf(g);
      return `${p.getAttribute("patternTransform")}|${p.getAttribute("width")}|${[...p.querySelectorAll("line")].map((l) => l.getAttribute("stroke-width")).join()}|${p.querySelectorAll("rect").length}`;
    });
    expect(new Set(keys).size).toBe(GRADES.length);
  });
});

describe("treatment words", () => {
  // The generic terms of the trade for thermal ablation with a fine electrode; no device name.
  it("names electrocautery generically", () => {
    expect(MODALITY_WORDS.electrocautery).toBe("Electrocautery / electrodesiccation");
    expect(Object.values(MODALITY_WORDS).join(" ")).not.toMatch(/hyfrec/i);
  });
});
