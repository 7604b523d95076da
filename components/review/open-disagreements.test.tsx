import { afterEach, describe, expect, it, vi } from "vitest";
import { fireEvent, render, screen, waitFor, within } from "@testing-library/react";
import { SWRConfig } from "swr";
import { OpenDisagreements } from "./open-disagreements";

// The disagreement panel against a faked server (fetch is the boundary): resolving one sends which
// status stands, and the answer the server gives back is shown as a resolved item.
const ADJ = "77777777-7777-4777-8777-777777777777";
const OPEN = { id: ADJ, trackLabel: "#2", proposedStatus: "persistent", comment: "Same site as before.", reviewer: "Dr Ada Moss", createdAt: "2027-03-01T10:00:00.000Z", reviewId: "r1", visitId: "v2", comparedVisitId: "v1", resolvedAt: null, resolvedBy: null, outcome: null, outcomeNote: null };
const reply = (status: number, body: unknown) => Promise.resolve(new Response(JSON.stringify(body), { status, headers: { "content-type": "application/json" } }));

afterEach(() => vi.unstubAllGlobals());

describe("OpenDisagreements", () => {
  it("Mark resolved asks which status stands, sends it, and then lists the outcome with who and when", async () => {
    let resolved = false;
    const spy = vi.fn((url: string, init?: RequestInit) => {
      if (init?.method === "POST") { resolved = true; return reply(200, { id: ADJ }); }
      return reply(200, resolved
        ? { openDisagreements: [], resolvedDisagreements: [{ ...OPEN, resolvedAt: "2027-03-02T08:00:00.000Z", resolvedBy: "Dr Lee Park", outcome: "recorded_kept", outcomeNote: "Different site on review of photos." }] }
        : { openDisagreements: [OPEN], resolvedDisagreements: [] });
    });
    vi.stubGlobal("fetch", spy);
    render(<SWRConfig value={{ provider: () => new Map(), dedupingInterval: 0 }}><OpenDisagreements patientId="p1" canResolve /></SWRConfig>);

    fireEvent.click(await screen.findByRole("button", { name: "Mark resolved" }));
    const record = screen.getByRole("button", { name: "Record resolution" }) as HTMLButtonElement;
    // Nothing is recorded until the clinician says which status stands.
    expect(record.disabled).toBe(true);
    fireEvent.click(screen.getByRole("radio", { name: "The recorded status stands" }));
    fireEvent.change(screen.getByLabelText("Note (optional)"), { target: { value: "Different site on review of photos." } });
    fireEvent.click(record);

    await waitFor(() => expect(spy.mock.calls.some(([, i]) => i?.method === "POST")).toBe(true));
    const [url, init] = spy.mock.calls.find(([, i]) => i?.method === "POST")!;
    expect(url).toBe(`/api/adjudications/${ADJ}/resolve`);
    expect(JSON.parse(String(init!.body))).toEqual({ outcome: "recorded_kept", note: "Different site on review of photos." });

    const item = await waitFor(() => {
      const el = document.querySelector<HTMLElement>('[data-resolved-disagreement="#2"]');
      if (!el) throw new Error("not resolved yet");
      return el;
    });
    expect(item.textContent).toContain("The recorded status stands");
    expect(item.textContent).toContain("Dr Lee Park, 2027-03-02");
    expect(within(item).getByText("“Different site on review of photos.”")).toBeTruthy();
    expect(screen.getByText("None open.")).toBeTruthy();
  });
});
