import { describe, expect, it } from "vitest";
import { render, screen } from "@testing-library/react";
import { withEmptyQuarters } from "@/lib/stats/study-figures";
import { QuarterGradeChart, type QuarterRow } from "./quarter-grade-chart";

const row = (quarter: string, hsil: number): QuarterRow => ({ quarter, benign: 0, condyloma: 0, lsil: 0, hsil, suspected_cancer: 0 });

describe("the study's grade chart", () => {
  it("says which quarters had no lesions instead of closing the gap silently", () => {
    const filled = withEmptyQuarters([row("2025 Q1", 2), row("2025 Q4", 1)], (q) => row(q, 0));
    render(<QuarterGradeChart rows={filled.rows} emptyQuarters={filled.empty} />);
    expect(screen.getByText(/No lesions at signed visits in 2025 Q2, 2025 Q3/)).toBeTruthy();
    // The table carries every quarter, the empty ones as zeros.
    expect(screen.getAllByRole("row").map((r) => r.firstElementChild?.textContent)).toEqual(["Quarter", "2025 Q1", "2025 Q2", "2025 Q3", "2025 Q4"]);
  });
});
