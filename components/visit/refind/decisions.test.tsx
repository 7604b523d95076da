import { afterEach, describe, expect, it, vi } from "vitest";
import { cleanup, fireEvent, screen, waitFor, within } from "@testing-library/react";
import { CONTEXT, NEW_LESION, T1, item, mount, reply, until, writes } from "./follow-up-fake";

// The decisions on an earlier track and on a fresh lesion, against a faked server (fetch is the
// boundary): what each control sends, and what it shows before and after a decision.
afterEach(() => vi.unstubAllGlobals());

const decision = (label: string, words: string) => within(item(label)).getByRole("button", { name: `${words} ${label}` });

describe("decisions at a follow-up visit", { timeout: 20_000 }, () => {
  it("no decision looks chosen until one is made; then only that one is pressed", async () => {
    mount({ on: (url, init) => (init?.method === "POST" && url.endsWith("/tracks") ? reply(200, { ...CONTEXT, ghosts: [{ ...CONTEXT.ghosts[0]!, checkHere: "not_found" }, CONTEXT.ghosts[1]!] }) : undefined) });
    await waitFor(() => expect(item("T1")).toBeTruthy());
    for (const words of ["Found", "Not found", "Treated"]) {
      const b = decision("T1", words);
      expect(b.getAttribute("aria-pressed")).toBe("false");
      // Filled is the look of a chosen decision: nothing is filled before a choice.
      expect(b.className).not.toMatch(/bg-lagoon-600/);
    }
    fireEvent.click(decision("T1", "Not found"));
    await waitFor(() => expect(decision("T1", "Not found").getAttribute("aria-pressed")).toBe("true"));
    expect(decision("T1", "Not found").className).toMatch(/bg-lagoon-600/);
    expect(decision("T1", "Found").getAttribute("aria-pressed")).toBe("false");
    expect(decision("T1", "Treated").getAttribute("aria-pressed")).toBe("false");
  });

  it("pressing the chosen mark again takes it back", async () => {
    const spy = mount({ context: { ...CONTEXT, ghosts: [{ ...CONTEXT.ghosts[0]!, checkHere: "treated" }, CONTEXT.ghosts[1]!] }, on: (url, init) => (init?.method === "POST" ? reply(200, CONTEXT) : undefined) });
    await waitFor(() => expect(decision("T1", "Treated").getAttribute("aria-pressed")).toBe("true"));
    fireEvent.click(decision("T1", "Treated"));
    await waitFor(() => expect(writes(spy)).toEqual([{ url: "/api/visits/v2/tracks", method: "POST", body: { action: "uncheck", trackId: T1 } }]));
  });

  it("Keep as new is sent to the server, and a reload shows the lesion kept, with who decided", async () => {
    const kept = { ...CONTEXT, suggestions: [], keptNew: [{ lesionId: NEW_LESION, decidedBy: "Dr Iris Vane", decidedAt: "2027-07-01T09:30:00.000Z" }] };
    const spy = mount({ on: (url, init) => (init?.method === "POST" && url.endsWith("/tracks") ? reply(200, kept) : undefined) });
    const row = await until('[data-suggestion="L1"]');
    fireEvent.click(within(row).getByRole("button", { name: "Keep as new: L1" }));
    await waitFor(() => expect(writes(spy)).toEqual([{ url: "/api/visits/v2/tracks", method: "POST", body: { action: "keep_new", lesionId: NEW_LESION } }]));

    // A fresh page (another examiner, or a reload) reads the decision back from the server.
    cleanup();
    vi.unstubAllGlobals();
    mount({ context: kept });
    const shown = await until('[data-kept-new="L1"]');
    expect(shown.textContent).toContain("kept as new (T9) by Dr Iris Vane, 2027-07-01");
    expect(document.querySelector('[data-suggestion="L1"]')).toBeNull();
    expect(within(shown).getByRole("button", { name: "Undo keeping L1 as new" })).toBeTruthy();
    expect(screen.queryByRole("button", { name: "Keep as new: L1" })).toBeNull();
  });
});
