import { afterEach, describe, expect, it, vi } from "vitest";
import { fireEvent, screen, waitFor, within } from "@testing-library/react";
import { CONTEXT, FRESH, NEW_LESION, T1, T3, item, mount, reply, until, writes } from "./follow-up-fake";

afterEach(() => vi.unstubAllGlobals());

describe("follow-up on the visit map", { timeout: 20_000 }, () => {
  it("draws earlier lesions as labelled outlines that keys and taps cannot edit", async () => {
    const spy = mount();
    const outline = await screen.findByRole("button", { name: /^Previous visit, track T1 \(still to look for\): HSIL/ });
    expect(outline.querySelector("text")?.textContent).toBe("T1");
    fireEvent.keyDown(outline, { key: "ArrowRight" });
    fireEvent.keyDown(outline, { key: "Delete" });
    fireEvent.pointerDown(outline.querySelector("[data-ghost-hit]")!, { pointerId: 1, clientX: 10, clientY: 10 });
    fireEvent.pointerUp(outline.querySelector("[data-ghost-hit]")!, { pointerId: 1, clientX: 10, clientY: 10 });
    // Picking it opens its card; no lesion was created, moved or deleted.
    expect(await screen.findByRole("heading", { name: "Earlier track T1" })).toBeTruthy();
    expect(writes(spy)).toEqual([]);
    expect(screen.getAllByRole("row").filter((r) => r.getAttribute("aria-selected") !== null)).toHaveLength(1);
  });

  it("Not found sends a check with the track and the outcome, and shows the result", async () => {
    const spy = mount({ on: (url, init) => (init?.method === "POST" && url.endsWith("/tracks") ? reply(200, { ...CONTEXT, ghosts: [{ ...CONTEXT.ghosts[0]!, checkHere: "not_found" }, CONTEXT.ghosts[1]!] }) : undefined) });
    await waitFor(() => expect(item("T1")).toBeTruthy());
    fireEvent.click(within(item("T1")).getByRole("button", { name: "Not found T1" }));
    await waitFor(() => expect(writes(spy)).toEqual([{ url: "/api/visits/v2/tracks", method: "POST", body: { action: "check", trackId: T1, outcome: "not_found" } }]));
    expect(await screen.findByText("T1 marked not found at this visit.")).toBeTruthy();
    await waitFor(() => expect(within(item("T1")).getByText(/Not found at this visit/)).toBeTruthy());
    expect(within(item("T1")).getByRole("button", { name: "Undo the mark on T1" })).toBeTruthy();
  });

  it("accepting a suggestion links that lesion to that track, with the reason shown", async () => {
    const spy = mount({ on: (url, init) => (init?.method === "POST" && url.endsWith("/tracks") ? reply(200, { ...CONTEXT, suggestions: [] }) : undefined) });
    const row = await until('[data-suggestion="L1"]');
    expect(row.textContent).toContain("overlaps 100% of T3's arc");
    fireEvent.click(within(row).getByRole("button", { name: "Accept L1 as T3" }));
    await waitFor(() => expect(writes(spy)).toEqual([{ url: "/api/visits/v2/tracks", method: "POST", body: { action: "link", lesionId: NEW_LESION, trackId: T3 } }]));
    expect(await screen.findByText("Lesion L1 linked to T3.")).toBeTruthy();
  });

  it("Found on an outline with no suggestion draws a lesion at its place, then links it", async () => {
    const created = { ...FRESH, id: "55555555-5555-4555-8555-555555555555", label: "L2", trackId: "x", clockStartH: 2.5, clockEndH: 3.5, grade: "hsil" as const };
    const spy = mount({
      context: { ...CONTEXT, suggestions: [] },
      on: (url, init) => (init?.method === "POST" && url.endsWith("/lesions") ? reply(201, { lesion: created }) : init?.method === "POST" ? reply(200, CONTEXT) : undefined),
    });
    await waitFor(() => expect(item("T1")).toBeTruthy());
    fireEvent.click(within(item("T1")).getByRole("button", { name: "Found T1" }));
    await waitFor(() => expect(writes(spy)).toHaveLength(2));
    const [draw, link] = writes(spy);
    expect(draw).toMatchObject({ url: "/api/visits/v2/lesions", body: { clockStartH: 2.5, clockEndH: 3.5, distanceStartCm: 1, distanceEndCm: 2, grade: "hsil" } });
    expect(link).toMatchObject({ url: "/api/visits/v2/tracks", body: { action: "link", lesionId: created.id, trackId: T1 } });
  });

  it("a refused merge shows the server's reason", async () => {
    const message = "Both tracks have a lesion at the same visit; they are different lesions.";
    mount({ on: (url, init) => (init?.method === "POST" ? reply(409, { error: { code: "conflict", message } }) : undefined) });
    fireEvent.click(await screen.findByRole("button", { name: "L1" }));
    fireEvent.change(await screen.findByLabelText("Merge T9 into"), { target: { value: T1 } });
    fireEvent.click(screen.getByRole("button", { name: "Merge" }));
    expect((await screen.findByRole("alert")).textContent).toContain(message);
  });

  it("a signed visit shows outlines and marks but no actions", async () => {
    mount({ readOnly: true, context: { ...CONTEXT, ghosts: [{ ...CONTEXT.ghosts[0]!, checkHere: "not_found" }, CONTEXT.ghosts[1]!] } });
    await waitFor(() => expect(item("T1")).toBeTruthy());
    expect(within(item("T1")).getByText(/Not found at this visit/)).toBeTruthy();
    expect(await screen.findByRole("button", { name: /^Previous visit, track T3/ })).toBeTruthy();
    for (const name of [/^Found/, /^Not found/, /^Treated/, /^Undo/, /^Accept/, "Keep as new"]) expect(screen.queryByRole("button", { name })).toBeNull();
  });

  it("draws the treated arcs as a band and shows the server's caution when the share is large", async () => {
    const caution = "Treated 58% of the circumference (7 of 12 clock hours). This reaches the clinic's caution level of 50%; consider staging treatment per local protocol.";
    mount({ treatments: { treatments: [{ arcs: [{ startH: 11, endH: 3 }] }, { arcs: [{ startH: 2, endH: 6 }] }], extent: { fraction: 7 / 12, level: "caution", message: caution }, cautionFraction: 0.5 } });
    const band = await until("[data-treated-ring]");
    // Worked example: 11→3 and 2→6 overlap from 2 to 3 o'clock, so their union is one arc 11→6
    // (7 of 12 h), drawn as one band; the caution text is the server's, shown as given.
    expect(band.getAttribute("aria-label")).toBe("Treated this visit: 11 o'clock to 6 o'clock");
    expect((await until('[data-treated-summary="caution"]')).textContent).toContain(caution);
  });
});
