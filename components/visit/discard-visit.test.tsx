import { afterEach, describe, expect, it, vi } from "vitest";
import { fireEvent, render, screen, waitFor } from "@testing-library/react";
import { DiscardVisit } from "./discard-visit";

const push = vi.fn();
vi.mock("next/navigation", () => ({ useRouter: () => ({ push, refresh: vi.fn() }) }));
afterEach(() => vi.unstubAllGlobals());

describe("discard a draft visit", () => {
  it("asks for confirmation and a reason in words before it sends anything, then leaves for the patient page", async () => {
    const fetchSpy = vi.fn(() => Promise.resolve(new Response(JSON.stringify({ ok: true }), { status: 200, headers: { "content-type": "application/json" } })));
    vi.stubGlobal("fetch", fetchSpy);
    render(<DiscardVisit visitId="v1" patientId="p1" />);
    fireEvent.click(screen.getByRole("button", { name: /Discard this draft/ }));
    const confirm = screen.getByRole("button", { name: "Discard draft" }) as HTMLButtonElement;
    expect(confirm.disabled).toBe(true);
    fireEvent.change(screen.getByLabelText(/Reason/), { target: { value: "......" } });
    expect(confirm.disabled).toBe(true);
    fireEvent.change(screen.getByLabelText(/Reason/), { target: { value: "Opened on the wrong patient" } });
    expect(fetchSpy).not.toHaveBeenCalled();
    fireEvent.click(confirm);
    await waitFor(() => expect(push).toHaveBeenCalledWith("/patients/p1"));
    expect(fetchSpy).toHaveBeenCalledTimes(1);
    const [url, init] = fetchSpy.mock.calls[0] as unknown as [string, RequestInit];
    expect(url).toBe("/api/visits/v1/discard");
    expect(JSON.parse(init.body as string)).toEqual({ reason: "Opened on the wrong patient" });
  });
});
