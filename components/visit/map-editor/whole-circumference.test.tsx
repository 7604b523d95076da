import { describe, expect, it, vi } from "vitest";
import { fireEvent, render, screen, waitFor } from "@testing-library/react";
import type { LesionDto } from "@/lib/validation/lesions";
import { LesionForm } from "./lesion-form";
import { LesionTable } from "./lesion-table";

// A circumferential lesion is recorded as the whole circumference, stored 0 → 12 (12 clock hours,
// 100 % of the circumference: geometry), never as 12 → 12, which would be a point.
const L1: LesionDto = {
  id: "l1", visitId: "v1", trackId: null, trackLabel: null, label: "L1", clockStartH: 2.5, clockEndH: 4, distanceStartCm: 1, distanceEndCm: 2, zone: "distal_canal",
  grade: "hsil", morphology: null, acetowhite: null, lugol: null, vessels: [], sizeMm: null, note: null, version: 1, histology: null, biopsyLabels: [], treated: false,
};
const form = (lesion: LesionDto, onCommit = vi.fn()) => render(<LesionForm lesion={lesion} convention="lithotomy" readOnly={false} saveInfo={undefined} onCommit={onCommit} onDelete={() => {}} />);

describe("the lesion form's whole-circumference control", { timeout: 20_000 }, () => {
  it("saves the lesion as 0 → 12 when ticked and hides the clock fields", async () => {
    const onCommit = vi.fn();
    form(L1, onCommit);
    fireEvent.click(screen.getByLabelText("Whole circumference"));
    await waitFor(() => expect(onCommit).toHaveBeenCalledWith({ clockStartH: 0, clockEndH: 12 }));
    expect(screen.queryByLabelText("Clock from (h:mm, lithotomy numbering)")).toBeNull();
    expect(screen.getByText(/the whole circumference \(12 of 12 clock hours\)/)).toBeTruthy();
  });

  it("shows a stored 0 → 12 lesion as the whole circumference, in the form and the table", () => {
    const ring = { ...L1, clockStartH: 0, clockEndH: 12 };
    render(<><LesionForm lesion={ring} convention="prone_jackknife" readOnly={false} saveInfo={undefined} onCommit={() => {}} onDelete={() => {}} /><LesionTable lesions={[ring]} conv="prone_jackknife" selectedId={null} status={{}} onSelect={() => {}} /></>);
    expect((screen.getByLabelText("Whole circumference") as HTMLInputElement).checked).toBe(true);
    expect(screen.getByRole("cell", { name: "Whole circumference" })).toBeTruthy();
  });

  it("gives back the arc drawn before when unticked", async () => {
    const onCommit = vi.fn();
    const { rerender } = form(L1, onCommit);
    fireEvent.click(screen.getByLabelText("Whole circumference"));
    await waitFor(() => expect(onCommit).toHaveBeenCalledTimes(1));
    // The editor hands the saved lesion back, as the map does after a save.
    rerender(<LesionForm lesion={{ ...L1, clockStartH: 0, clockEndH: 12, version: 2 }} convention="lithotomy" readOnly={false} saveInfo={undefined} onCommit={onCommit} onDelete={() => {}} />);
    fireEvent.click(screen.getByLabelText("Whole circumference"));
    await waitFor(() => expect(onCommit).toHaveBeenLastCalledWith({ clockStartH: 2.5, clockEndH: 4 }));
  });
});
