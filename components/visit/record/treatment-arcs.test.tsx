import { afterEach, describe, expect, it, vi } from "vitest";
import { fireEvent, render, screen, waitFor } from "@testing-library/react";
import { SWRConfig } from "swr";
import { TreatmentsPanel } from "./treatments-panel";

// The network is faked (fetch is the DOM boundary); what is checked is what the form shows and sends.
const json = (body: unknown, status = 200) => Promise.resolve(new Response(JSON.stringify(body), { status, headers: { "content-type": "application/json" } }));
const A = { id: "la", label: "A", grade: "hsil", clockStartH: 2, clockEndH: 4, histology: null };
const B = { id: "lb", label: "B", grade: "hsil", clockStartH: 3, clockEndH: 6, histology: null };
const posts: unknown[] = [];

afterEach(() => { vi.unstubAllGlobals(); posts.length = 0; });

function renderPanel() {
  vi.stubGlobal("fetch", vi.fn((url: string, init?: RequestInit) => {
    if (init?.method === "POST") { posts.push(JSON.parse(String(init.body))); return json({ id: "t1" }, 201); }
    return url.endsWith("/lesions") ? json({ lesions: [A, B] }) : json({ treatments: [], extent: { fraction: 0, level: "ok", message: "" }, cautionFraction: 0.5 });
  }));
  render(<SWRConfig value={{ provider: () => new Map(), dedupingInterval: 0 }}><TreatmentsPanel visitId="v1" canEdit conv="lithotomy" /></SWRConfig>);
}
const typeArc = (from: string, to: string) => {
  fireEvent.change(screen.getByLabelText("Arc 1 from (clock hour)"), { target: { value: from } });
  fireEvent.change(screen.getByLabelText("Arc 1 to (clock hour)"), { target: { value: to } });
};

describe("TreatmentsPanel: the whole circumference", { timeout: 20_000 }, () => {
  it("sends 0 → 12 and shows the circumference caution with its reason field", async () => {
    // 12 of 12 clock hours = 100 % of the circumference (geometry); the caution from half the
    // circumference is from memory (staged treatment: Pineda CE et al., J Gastrointest Surg 2007).
    renderPanel();
    await screen.findByRole("option", { name: "A" });
    fireEvent.click(screen.getByLabelText("Whole circumference treated"));
    expect(screen.queryByLabelText("Arc 1 from (clock hour)")).toBeNull();
    expect(await screen.findByText(/This reaches the caution level for one session/)).toBeTruthy();
    expect(screen.getByText(/With this treatment: Treated 100% of the circumference \(12 of 12 clock hours\)/)).toBeTruthy();
    fireEvent.change(screen.getByLabelText("Reason for treating this much in one session"), { target: { value: "Planned single session, patient informed" } });
    fireEvent.click(screen.getByRole("button", { name: "Add treatment" }));
    await waitFor(() => expect(posts).toHaveLength(1));
    expect(posts[0]).toMatchObject({ arcs: [{ startH: 0, endH: 12 }], extentOverrideReason: "Planned single session, patient informed" });
  });
});

describe("TreatmentsPanel: lesions the arcs reach", { timeout: 20_000 }, () => {
  it("says which lesions the arcs cover fully and asks about one reached in part", async () => {
    renderPanel();
    await screen.findByRole("option", { name: "A" });
    typeArc("1", "5"); // covers A (2 → 4) fully, B (3 → 6) only from 3 to 5
    expect(await screen.findByText(/Covered fully, counted as treated: lesion A\./)).toBeTruthy();
    const question = screen.getByRole("radiogroup", { name: "Lesion B, reached in part: treated?" });
    expect(question.textContent).toMatch(/only in part/);
    fireEvent.click(screen.getAllByLabelText("No, not treated")[0]!);
    fireEvent.click(screen.getByRole("button", { name: "Add treatment" }));
    await waitFor(() => expect(posts).toHaveLength(1));
    expect(posts[0]).toMatchObject({ lesionId: null, arcs: [{ startH: 1, endH: 5 }], partialCover: [{ lesionId: "lb", treated: false }] });
  });

  it("reads a typed arc across 12 o'clock (11 → 7 covers both)", async () => {
    renderPanel();
    await screen.findByRole("option", { name: "A" });
    typeArc("11", "7");
    expect(await screen.findByText(/Covered fully, counted as treated: lesion A, B\./)).toBeTruthy();
    expect(screen.queryByRole("radiogroup")).toBeNull();
  });
});
