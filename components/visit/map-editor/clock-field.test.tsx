import { describe, expect, it, vi } from "vitest";
import { fireEvent, render, screen, waitFor } from "@testing-library/react";
import type { LesionDto } from "@/lib/validation/lesions";
import { LesionForm } from "./lesion-form";
import { LesionTable } from "./lesion-table";

const L1: LesionDto = {
  id: "l1", visitId: "v1", trackId: null, trackLabel: null, label: "L1", clockStartH: 2.5, clockEndH: 4, distanceStartCm: 1, distanceEndCm: 2, zone: "distal_canal",
  grade: "lsil", morphology: null, acetowhite: null, lugol: null, vessels: [], sizeMm: null, note: null, version: 1, histology: null, biopsyLabels: [], treated: false,
};

describe("one clock format in the form and the table", () => {
  it("shows 2:30 in the lesion form, as the table does, never 2.5", () => {
    render(<><LesionForm lesion={L1} convention="lithotomy" readOnly={false} saveInfo={undefined} onCommit={() => {}} onDelete={() => {}} /><LesionTable lesions={[L1]} conv="lithotomy" selectedId={null} status={{}} onSelect={() => {}} /></>);
    const from = screen.getByLabelText("Clock from (h:mm, lithotomy numbering)") as HTMLInputElement;
    expect(from.value).toBe("2:30");
    expect(screen.getByText("2:30 → 4 o'clock")).toBeTruthy();
  });

  it("takes 3:30 typed in the field as 3.5 hours", async () => {
    const onCommit = vi.fn();
    render(<LesionForm lesion={L1} convention="lithotomy" readOnly={false} saveInfo={undefined} onCommit={onCommit} onDelete={() => {}} />);
    const from = screen.getByLabelText("Clock from (h:mm, lithotomy numbering)") as HTMLInputElement;
    fireEvent.change(from, { target: { value: "3:30" } });
    fireEvent.blur(from);
    await waitFor(() => expect(onCommit).toHaveBeenCalledWith(expect.objectContaining({ clockStartH: 3.5 })));
    expect(from.value).toBe("3:30");
  });
});
