import { afterEach, describe, expect, it, vi } from "vitest";
import { fireEvent, render, screen, waitFor, within } from "@testing-library/react";
import { SWRConfig } from "swr";
import type { LesionDto, VisitMapDto } from "@/lib/validation/lesions";
import { VisitMapEditor } from "./map-editor/visit-map-editor";
import { BiopsiesPanel } from "./biopsies-panel";
import { VisitNumbering } from "./numbering";

// Prone jack-knife turns the view half a circle: 12 o'clock posterior, 6 anterior, 3 the
// patient's right, 9 the patient's left (surgical anatomy texts; derived, from memory).
// Stored lithotomy 3 (patient's left) therefore reads 9 in prone numbering.
const PRONE: VisitMapDto["visit"] = { id: "v1", patientId: "p1", visitDate: "2026-01-02", status: "draft", patientPosition: "prone_jackknife", readOnly: false };
const L1: LesionDto = {
  id: "l1", visitId: "v1", trackId: null, trackLabel: null, label: "L1", clockStartH: 3, clockEndH: 4, distanceStartCm: 1, distanceEndCm: 2, zone: "distal_canal",
  grade: "lsil", morphology: null, acetowhite: null, lugol: null, vessels: [], sizeMm: null, note: null, version: 1, histology: null, biopsyLabels: [], treated: false,
};
const reply = (status: number, body: unknown) => Promise.resolve(new Response(JSON.stringify(body), { status, headers: { "content-type": "application/json" } }));

function stubFetch(posts: unknown[] = []) {
  vi.stubGlobal("fetch", vi.fn((url: string, init?: RequestInit) => {
    if (init?.method === "POST") { posts.push(JSON.parse(String(init.body))); return reply(201, { biopsy: { id: "b1" } }); }
    if (url.endsWith("/biopsies")) return reply(200, { biopsies: [] });
    if (url.endsWith("/lesions")) return reply(200, { visit: PRONE, lesions: [L1] });
    if (init?.method === "PATCH") return reply(200, {});
    return reply(200, { ghosts: [], tracks: [], suggestions: [], treatments: [], extent: null });
  }));
}
const wrap = (ui: React.ReactNode) => render(<SWRConfig value={{ provider: () => new Map(), dedupingInterval: 0 }}>{ui}</SWRConfig>);

afterEach(() => vi.unstubAllGlobals());

describe("the visit page's clock numbering", () => {
  it("opens in the position of the examination, not the user's usual numbering", () => {
    stubFetch();
    // The user's preference is lithotomy; the patient was examined prone jack-knife.
    wrap(<VisitMapEditor visitId="v1" initialConvention="lithotomy" initialMap={{ visit: PRONE, lesions: [L1] }} />);
    const group = screen.getByRole("radiogroup", { name: "Clock numbering" });
    expect(within(group).getByRole("radio", { name: "Prone jack-knife" }).getAttribute("aria-checked")).toBe("true");
    expect(screen.getByRole("columnheader", { name: "Clock (prone jack-knife numbering)" })).toBeTruthy();
    expect(screen.getByText("9 o'clock → 10 o'clock")).toBeTruthy();
  });

  it("says when the map is shown in another numbering than the examination's", () => {
    stubFetch();
    wrap(<VisitMapEditor visitId="v1" initialConvention="lithotomy" initialMap={{ visit: PRONE, lesions: [L1] }} />);
    fireEvent.click(screen.getByRole("radio", { name: "Lithotomy" }));
    expect(screen.getByText(/Shown in lithotomy numbering; the patient was examined prone jack-knife/)).toBeTruthy();
  });

  it("numbers the biopsy clock as the map does, and stores it in the lithotomy frame", async () => {
    const posts: unknown[] = [];
    stubFetch(posts);
    wrap(
      <VisitNumbering position="prone_jackknife">
        <VisitMapEditor visitId="v1" initialConvention="prone_jackknife" initialMap={{ visit: PRONE, lesions: [L1] }} />
        <BiopsiesPanel visitId="v1" canEdit canEnterResults={false} />
      </VisitNumbering>,
    );
    const clock = screen.getByLabelText("Clock (o'clock, prone jack-knife numbering)");
    fireEvent.change(clock, { target: { value: "12" } });
    fireEvent.change(screen.getByLabelText("cm from verge"), { target: { value: "1" } });
    fireEvent.click(screen.getByRole("button", { name: "Take biopsy here" }));
    // Prone 12 o'clock is posterior: lithotomy 6 o'clock.
    await waitFor(() => expect(posts).toEqual([{ clockH: 6, distanceCm: 1 }]));
    // One switch turns every clock field on the page.
    fireEvent.click(screen.getByRole("radio", { name: "Lithotomy" }));
    expect(screen.getByLabelText("Clock (o'clock, lithotomy numbering)")).toBeTruthy();
  });
});

describe("the visit page on a tablet", () => {
  it("shows a record section beside the map, in a tab, with the map still there", () => {
    stubFetch();
    wrap(
      <VisitMapEditor visitId="v1" initialConvention="prone_jackknife" initialMap={{ visit: PRONE, lesions: [L1] }}
        sections={[{ id: "biopsies", label: "Biopsies", content: <p>Biopsy form here</p> }]} />,
    );
    expect(screen.getByText("Biopsy form here").closest("[role=tabpanel]")!.hasAttribute("hidden")).toBe(true);
    fireEvent.click(screen.getByRole("tab", { name: "Biopsies" }));
    const panel = screen.getByText("Biopsy form here").closest("[role=tabpanel]")!;
    expect(panel.hasAttribute("hidden")).toBe(false);
    // Side by side: the map's column and the section's tabs are the two cells of one grid row.
    const mapColumn = document.querySelector("[data-map-column]")!;
    expect(mapColumn.parentElement).toBe(panel.parentElement!.parentElement);
    expect(within(mapColumn as HTMLElement).getByRole("button", { name: /^L1: LSIL/ })).toBeTruthy();
  });
});
