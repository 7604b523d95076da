import { describe, expect, it, vi } from "vitest";
import { fireEvent, render, screen, within } from "@testing-library/react";
import { TRACK_STATUSES } from "@/lib/domain/vocab";
import { StatusGrid } from "./status-grid";
import { StatusGlyph } from "./status-glyph";

const visits = [
  { id: "v1", visitDate: "2025-03-04" },
  { id: "v2", visitDate: "2025-09-16" },
];
const tracks = [{ id: "t1", label: "T1" }, { id: "t2", label: "T2" }];
// Reason wording as the status rules write it; "progressed" = higher grade, e.g. LSIL to HSIL
// (definitions after Liu Y, Sigel K, Gaisa MM, Papillomavirus Research 2018;5:S9).
const statuses = [
  { trackId: "t1", visitId: "v1", status: "new" as const, effectiveGrade: "lsil" as const, reason: "First seen at 2025-03-04 as LSIL." },
  { trackId: "t1", visitId: "v2", status: "progressed" as const, effectiveGrade: "hsil" as const, reason: "LSIL at 2025-03-04 is HSIL now." },
];

function renderGrid(onSelectTrack = vi.fn()) {
  render(<StatusGrid visits={visits} tracks={tracks} statuses={statuses} checks={[{ trackId: "t2", visitId: "v2", outcome: "not_found" }]} selectedTrackId={null} onSelectTrack={onSelectTrack} />);
  return onSelectTrack;
}

describe("StatusGrid", () => {
  // WCAG 2.1 SC 1.3.1 Info and Relationships: data tables expose their row and column headers.
  it("is a real table with visit dates as column headers and tracks as row headers", () => {
    renderGrid();
    expect(screen.getByRole("table")).toBeTruthy();
    expect(screen.getByRole("columnheader", { name: "2025-03-04" })).toBeTruthy();
    expect(screen.getByRole("columnheader", { name: "2025-09-16" })).toBeTruthy();
    expect(screen.getByRole("rowheader", { name: /T1/ })).toBeTruthy();
  });

  it("puts the status word, its glyph and the reason in the cell; the reason is in the accessible name and title", () => {
    renderGrid();
    const cell = screen.getByRole("cell", { name: /Progressed.*LSIL at 2025-03-04 is HSIL now/ });
    expect(within(cell).getByText("Progressed")).toBeTruthy();
    expect(cell.querySelector('[data-status-glyph="progressed"]')).not.toBeNull();
    expect(cell.getAttribute("title")).toContain("LSIL at 2025-03-04 is HSIL now");
  });

  it("says what was recorded for a track looked for and not found", () => {
    renderGrid();
    expect(screen.getByRole("cell", { name: /No record.*looked for, not found/ })).toBeTruthy();
  });

  it("selects a track from its row header", () => {
    const onSelect = renderGrid();
    fireEvent.click(screen.getByRole("button", { name: /T1/ }));
    expect(onSelect).toHaveBeenCalledWith("t1");
  });
});

describe("status glyphs are not colour alone", () => {
  // WCAG 2.1 SC 1.4.1 Use of Color: colour is not the only visual means of conveying information.
  // Strip every colour attribute: the shapes that remain must still differ from status to status.
  it("each status has a distinct shape once colour is removed", () => {
    const shapes = TRACK_STATUSES.map((s) => {
      const { container, unmount } = render(<StatusGlyph status={s} />);
      const svg = container.querySelector("svg")!;
      svg.querySelectorAll("*").forEach((el) => { el.removeAttribute("fill"); el.removeAttribute("stroke"); });
      const html = svg.innerHTML.replace(/data-status-glyph="[^"]*"/g, "");
      unmount();
      return html;
    });
    expect(new Set(shapes).size).toBe(TRACK_STATUSES.length);
    for (const s of shapes) expect(s.length).toBeGreaterThan(10);
  });
});

describe("StatusGrid: a draft visit", () => {
  // Statuses come from signed visits only: a draft's column says so rather than "No record".
  it("labels the draft's column and its cells, with no status", () => {
    render(<StatusGrid visits={[...visits, { id: "v3", visitDate: "2026-01-20", status: "draft" }]} tracks={tracks} statuses={statuses} selectedTrackId={null} onSelectTrack={vi.fn()} />);
    expect(screen.getAllByRole("columnheader").map((h) => h.textContent)).toContain("2026-01-20 draft, not signed");
    const cells = document.querySelectorAll('td[title="No status: the visit is a draft"]');
    expect(cells).toHaveLength(2);
    for (const c of cells) expect(c.textContent).toBe("Draft: no status yet");
  });
});
