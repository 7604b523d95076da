import { describe, expect, it } from "vitest";
import { render, screen } from "@testing-library/react";
import { HsilExtentNote } from "./hsil-extent-note";

// Source: ANCHOR (Palefsky JM et al., N Engl J Med 2022;386:2273-82): lesions covering > 50% of the
// canal or perianal region had a higher risk of progression. 30° of arc per clock hour (geometry).
const l = (clockStartH: number, clockEndH: number, grade: "lsil" | "hsil" | "suspected_cancer", histology: "benign" | "hsil" | null = null) =>
  ({ clockStartH, clockEndH, grade, histology });

describe("HSIL over more than half of the circumference on the map summary", () => {
  it("shows 7 of 12 hours of HSIL (10 → 2 joined with 1 → 5) as 58%, more than half", () => {
    // Union 10 → 5 clockwise = 7 h = 7/12 = 58% (worked by hand).
    render(<HsilExtentNote lesions={[l(10, 2, "hsil"), l(1, 5, "hsil"), l(6, 9, "lsil")]} />);
    expect(screen.getByText(/covers 58% of the circumference/)).toBeTruthy();
  });
  it("says nothing at exactly half (6 h), since ANCHOR's threshold is more than 50%", () => {
    const { container } = render(<HsilExtentNote lesions={[l(0, 6, "hsil")]} />);
    expect(container.textContent).toBe("");
  });
  it("lets histology decide: an HSIL impression with benign histology does not count (LAST, Darragh 2012)", () => {
    const { container } = render(<HsilExtentNote lesions={[l(0, 8, "hsil", "benign")]} />);
    expect(container.textContent).toBe("");
  });
  it("counts HSIL on histology under a low-grade impression", () => {
    // 3 → 11 = 8 h = 67% (worked by hand).
    render(<HsilExtentNote lesions={[l(3, 11, "lsil", "hsil")]} />);
    expect(screen.getByText(/covers 67% of the circumference/)).toBeTruthy();
  });
});
