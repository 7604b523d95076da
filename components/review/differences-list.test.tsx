import { describe, expect, it, vi } from "vitest";
import { fireEvent, render, screen } from "@testing-library/react";
import { diffVisits, type DiffLesion } from "@/lib/tracking/visit-diff";
import { DifferencesList } from "./differences-list";

// Worked example by hand: earlier visit T1 HSIL 1-3 o'clock, T2 LSIL 6-7, T3 condyloma 9-10;
// later visit T1 HSIL 2-4 (moved one hour), T2 HSIL (LSIL -> HSIL: LAST two tiers, Darragh 2012),
// T3 not found, T4 new. Moved = at least 1 h or 1 cm: the product's rule, common practice, no source.
const l = (trackId: string, grade: DiffLesion["grade"], a: number, b: number): DiffLesion => ({
  id: `${trackId}-${a}`, trackId, name: trackId, clockStartH: a, clockEndH: b, distanceStartCm: 1, distanceEndCm: 2, grade,
});
const earlier = [l("T1", "hsil", 1, 3), l("T2", "lsil", 6, 7), l("T3", "condyloma", 9, 10)];
const later = [l("T1", "hsil", 2, 4), l("T2", "hsil", 6, 7), l("T4", "hsil", 11, 0)];

describe("DifferencesList", () => {
  it("lists new, gone, changed grade and moved in words, one item each", () => {
    render(<DifferencesList differences={diffVisits(earlier, later, { laterChecks: { T3: "not_found" } })} selectedTrackId={null} onSelectTrack={() => {}} />);
    const items = screen.getAllByRole("listitem");
    expect(items.map((i) => i.getAttribute("data-diff-kind"))).toEqual(["new", "gone", "grade", "moved"]);
    expect(screen.getByRole("button", { name: /New.*T4 is new: HSIL/ })).toBeTruthy();
    expect(screen.getByRole("button", { name: /Gone.*T3.*looked for and not found/ })).toBeTruthy();
    expect(screen.getByRole("button", { name: /Changed grade.*from LSIL to HSIL/ })).toBeTruthy();
    expect(screen.getByRole("button", { name: /Moved.*T1 moved.*1 hour/ })).toBeTruthy();
  });

  it("selecting a difference selects its track; pointing at it rings the track", () => {
    const onSelect = vi.fn();
    const onHover = vi.fn();
    render(<DifferencesList differences={diffVisits(earlier, later)} selectedTrackId={null} onSelectTrack={onSelect} onHoverTrack={onHover} />);
    const moved = screen.getByRole("button", { name: /Moved/ });
    fireEvent.pointerEnter(moved);
    expect(onHover).toHaveBeenCalledWith("T1");
    fireEvent.click(moved);
    expect(onSelect).toHaveBeenCalledWith("T1");
  });

  it("says so when nothing changed", () => {
    render(<DifferencesList differences={diffVisits(earlier, earlier)} selectedTrackId={null} onSelectTrack={() => {}} />);
    expect(screen.getByText(/No differences/)).toBeTruthy();
  });
});
