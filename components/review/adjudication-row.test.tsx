import { describe, expect, it, vi } from "vitest";
import { fireEvent, render, screen, waitFor } from "@testing-library/react";
import { AdjudicationRow, type AdjudicationTarget } from "./adjudication-row";
import { ReviewsForMe, type ReviewForMe } from "./reviews-for-me";

const target: AdjudicationTarget = { trackId: "t1", label: "#1", status: "persistent", effectiveGrade: "hsil", reason: "Seen again at the same place." };
const row = (props: Partial<Parameters<typeof AdjudicationRow>[0]> = {}) =>
  render(<ul><AdjudicationRow target={target} existing={null} canEdit selected={false} onSelect={() => {}} onSave={async () => {}} {...props} /></ul>);

describe("a reviewer's verdict on one track", () => {
  // A screen-reader user moving from button to button hears each one's track, not "Agree, Agree, Agree".
  it("names the track in every verdict button", () => {
    row();
    fireEvent.click(screen.getByRole("button", { name: "Disagree with #1" }));
    expect(screen.getByRole("button", { name: /^Agree with #1/ })).toBeTruthy();
    expect(screen.getByRole("button", { name: "Not examined: #1" })).toBeTruthy();
    expect(screen.getByRole("button", { name: "Save disagreement on #1" })).toBeTruthy();
  });

  it("records 'not examined' without a status or comment, and shows it", async () => {
    const onSave = vi.fn(async () => {});
    row({ onSave });
    fireEvent.click(screen.getByRole("button", { name: "Not examined: #1" }));
    await waitFor(() => expect(onSave).toHaveBeenCalledWith({ verdict: "not_examined" }));
    const existing = { id: "a1", reviewId: "r1", trackId: "t1", verdict: "not_examined" as const, proposedStatus: null, comment: null, resolvedAt: null, createdAt: "2026-01-01T00:00:00Z" };
    const { container } = render(<ul><AdjudicationRow target={target} existing={existing as never} canEdit={false} selected={false} onSelect={() => {}} onSave={onSave} /></ul>);
    expect(container.querySelector("[data-verdict=not_examined]")?.textContent).toMatch(/not examined/);
  });
});

describe("reviews for me", () => {
  const r: ReviewForMe = {
    id: "r1", status: "requested", requestedAt: "2026-02-03T10:00:00.000Z", patientId: "p1", visitId: "v2", comparedVisitId: "v1", mrn: "HBR-0001",
    familyName: "Quill", givenName: "Ada", visitDate: "2025-09-01", comparedVisitDate: "2025-03-01", requestedBy: "Dr Okafor", verdicts: 0,
  };
  it("opens each review on the exact pair it was asked for", () => {
    render(<ReviewsForMe rows={[r]} />);
    expect(screen.getByRole("link", { name: "Quill, Ada" }).getAttribute("href")).toBe("/patients/p1/compare?a=v1&b=v2");
    expect(screen.getByText("2025-03-01 → 2025-09-01")).toBeTruthy();
  });
  it("says so when nothing is waiting", () => {
    render(<ReviewsForMe rows={[]} />);
    expect(screen.getByText("No review is waiting for you.")).toBeTruthy();
  });
});
