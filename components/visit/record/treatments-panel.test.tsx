import { afterEach, describe, expect, it, vi } from "vitest";
import { fireEvent, render, screen, waitFor } from "@testing-library/react";
import { SWRConfig } from "swr";
import { TreatmentsPanel } from "./treatments-panel";

// The network is faked (fetch is the DOM boundary); what is checked is what the form shows.
const reply = (body: unknown) => Promise.resolve(new Response(JSON.stringify(body), { status: 200, headers: { "content-type": "application/json" } }));
const LESION = { id: "l1", label: "L1", grade: "hsil", clockStartH: 11, clockEndH: 2, histology: null };
const SUSPECT = { id: "l2", label: "L2", grade: "suspected_cancer", clockStartH: 5, clockEndH: 7, histology: null };

afterEach(() => vi.unstubAllGlobals());

function renderPanel(conv: "lithotomy" | "prone_jackknife") {
  vi.stubGlobal("fetch", vi.fn((url: string) => url.endsWith("/lesions")
    ? reply({ lesions: [LESION, SUSPECT] })
    : reply({ treatments: [], extent: { fraction: 0, level: "ok", message: "" }, cautionFraction: 0.5 })));
  render(<SWRConfig value={{ provider: () => new Map(), dedupingInterval: 0 }}><TreatmentsPanel visitId="v1" canEdit conv={conv} /></SWRConfig>);
}

describe("TreatmentsPanel: choosing a lesion fills in its arc", { timeout: 20_000 }, () => {
  it("prefills the lesion's 11 → 2 o'clock extent in lithotomy numbering", async () => {
    renderPanel("lithotomy");
    await screen.findByRole("option", { name: "L1" });
    fireEvent.change(screen.getByLabelText("Lesion (optional)"), { target: { value: "l1" } });
    await waitFor(() => expect((screen.getByLabelText("Arc 1 from (clock hour)") as HTMLInputElement).value).toBe("11"));
    expect((screen.getByLabelText("Arc 1 to (clock hour)") as HTMLInputElement).value).toBe("2");
  });

  it("writes the same arc in prone numbering, turned half a circle (11 → 5, 2 → 8)", async () => {
    // Prone jack-knife: the view is turned half a circle (derived, from memory; see the clock conventions).
    renderPanel("prone_jackknife");
    await screen.findByRole("option", { name: "L1" });
    fireEvent.change(screen.getByLabelText("Lesion (optional)"), { target: { value: "l1" } });
    await waitFor(() => expect((screen.getByLabelText("Arc 1 from (clock hour)") as HTMLInputElement).value).toBe("5"));
    expect((screen.getByLabelText("Arc 1 to (clock hour)") as HTMLInputElement).value).toBe("8");
  });
});

describe("TreatmentsPanel: a lesion that may be cancer", { timeout: 20_000 }, () => {
  it("shows a strong caution and asks for a reason before the treatment is saved", async () => {
    // Ablating a possible cancer can destroy tissue needed for diagnosis (common practice, no source).
    renderPanel("lithotomy");
    await screen.findByRole("option", { name: "L2" });
    expect(screen.queryByRole("alert")).toBeNull();
    fireEvent.change(screen.getByLabelText("Lesion (optional)"), { target: { value: "l2" } });
    expect((await screen.findByRole("alert")).textContent).toMatch(/L2 is graded suspected cancer/);
    expect(screen.getByLabelText("Reason for treating a lesion that may be cancer")).toBeTruthy();
  });
});
