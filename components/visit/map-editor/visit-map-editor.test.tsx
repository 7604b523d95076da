import { afterEach, describe, expect, it, vi } from "vitest";
import { act, fireEvent, render, screen, waitFor } from "@testing-library/react";
import { SWRConfig } from "swr";
import type { LesionDto, VisitMapDto } from "@/lib/validation/lesions";
import { VisitMapEditor } from "./visit-map-editor";

// The network is faked (fetch is the DOM boundary); what is checked is what the user sees:
// a change shows at once, a failure stays visible with a retry, a conflict says so.
const VISIT: VisitMapDto["visit"] = { id: "v1", patientId: "p1", visitDate: "2026-01-02", status: "draft", patientPosition: "lithotomy", readOnly: false };
const L1: LesionDto = {
  id: "l1", visitId: "v1", trackId: null, trackLabel: null, label: "L1", clockStartH: 3, clockEndH: 4, distanceStartCm: 1, distanceEndCm: 2, zone: "distal_canal",
  grade: "lsil", morphology: null, acetowhite: null, lugol: null, vessels: [], sizeMm: null, note: null, version: 1, histology: "hsil", biopsyLabels: ["A"], treated: false,
};

function reply(status: number, body: unknown) {
  return Promise.resolve(new Response(JSON.stringify(body), { status, headers: { "content-type": "application/json" } }));
}

function mount(fetchImpl: (url: string, init?: RequestInit) => Promise<Response>, canEdit = true) {
  const spy = vi.fn(fetchImpl);
  vi.stubGlobal("fetch", spy);
  render(
    <SWRConfig value={{ provider: () => new Map(), dedupingInterval: 0 }}>
      <VisitMapEditor visitId="v1" initialConvention="lithotomy" canEdit={canEdit} />
    </SWRConfig>,
  );
  return spy;
}

afterEach(() => vi.unstubAllGlobals());

describe("VisitMapEditor first paint", () => {
  it("draws the map the page read on the server in its first render, without waiting for a fetch", async () => {
    // The fetch never answers: whatever is on screen came from the page.
    const fetchSpy = vi.fn<(url: string) => Promise<Response>>(() => new Promise<Response>(() => {}));
    vi.stubGlobal("fetch", fetchSpy);
    const { unmount } = render(
      <SWRConfig value={{ provider: () => new Map(), dedupingInterval: 0 }}>
        <VisitMapEditor visitId="v1" initialConvention="lithotomy" initialMap={{ visit: VISIT, lesions: [L1] }} />
      </SWRConfig>,
    );
    expect(screen.getByRole("button", { name: /^L1: LSIL/ })).toBeTruthy();
    expect(screen.queryByText("Loading the map…")).toBeNull();
    // The page's read is not repeated on mount (it would be a second read and a second audit row);
    // SWR defers a mount revalidation to the next animation frame, so wait past a few.
    await act(() => new Promise((r) => setTimeout(r, 100)));
    expect(fetchSpy.mock.calls.filter(([url]) => url.endsWith("/lesions"))).toHaveLength(0);
    unmount();
    // Without it, the map waits for its fetch.
    render(
      <SWRConfig value={{ provider: () => new Map(), dedupingInterval: 0 }}>
        <VisitMapEditor visitId="v1" initialConvention="lithotomy" />
      </SWRConfig>,
    );
    expect(screen.getByText("Loading the map…")).toBeTruthy();
    expect(screen.queryByRole("button", { name: /^L1: LSIL/ })).toBeNull();
  });
});

describe("VisitMapEditor coming back to a visit", () => {
  it("shows the page's fresh read, not what an earlier visit to the page left in SWR's cache", async () => {
    vi.stubGlobal("fetch", vi.fn(() => new Promise<Response>(() => {})));
    const stale: VisitMapDto = { visit: VISIT, lesions: [{ ...L1, id: "l7", label: "L7" }] };
    render(
      <SWRConfig value={{ provider: () => new Map([["/api/visits/v1/lesions", { data: stale }]]), dedupingInterval: 0 }}>
        <VisitMapEditor visitId="v1" initialConvention="lithotomy" initialMap={{ visit: VISIT, lesions: [L1] }} />
      </SWRConfig>,
    );
    expect(await screen.findByRole("button", { name: /^L1: LSIL/ })).toBeTruthy();
    expect(screen.queryByRole("button", { name: /^L7: LSIL/ })).toBeNull();
  });
});

// Generous timeout: the shared test machine is busy and each step re-renders the whole screen.
describe("VisitMapEditor saving", { timeout: 20_000 }, () => {
  it("a new lesion appears before the server answers; a failed save says so and can be retried", async () => {
    let postCount = 0;
    let releaseFirst: (r: Response) => void = () => {};
    const spy = mount((url, init) => {
      if (!init?.method) return reply(200, { visit: VISIT, lesions: [] });
      postCount += 1;
      if (postCount === 1) return new Promise<Response>((r) => { releaseFirst = r; });
      return reply(201, { lesion: { ...L1, id: "l9", label: "L9", histology: null, biopsyLabels: [], clockStartH: 11.5, clockEndH: 0.5 } });
    });
    fireEvent.click(await screen.findByRole("button", { name: "New lesion" }));
    // Shown at once with a temporary label, while the POST is still open.
    expect(await screen.findByRole("button", { name: /^New…: LSIL/ })).toBeTruthy();
    const post = spy.mock.calls.find(([, i]) => i?.method === "POST")!;
    expect(post[1]!.headers).toMatchObject({ "content-type": "application/json" });
    await act(async () => releaseFirst(new Response(JSON.stringify({ error: { code: "unavailable", message: "Database unavailable." } }), { status: 503 })));
    // The failure is said in the inspector and the table, which follow the map a frame later.
    expect((await screen.findAllByText(/Not saved: Database unavailable/, {}, { timeout: 10_000 })).length).toBeGreaterThan(0);
    expect(screen.getByRole("button", { name: /^New…: LSIL.*not saved/ })).toBeTruthy();
    fireEvent.click(screen.getAllByRole("button", { name: "Retry" })[0]!);
    expect(await screen.findByRole("button", { name: /^L9: LSIL/ })).toBeTruthy();
    // The retry carries the first attempt's key, so a create whose answer was lost is not made twice.
    const keys = spy.mock.calls.filter(([, i]) => i?.method === "POST").map(([, i]) => (JSON.parse(String(i!.body)) as { clientKey?: string }).clientKey);
    expect(keys).toHaveLength(2);
    expect(keys[0]).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/);
    expect(keys[1]).toBe(keys[0]);
    // The table and inspector follow the map in a deferred render: wait for them too.
    await waitFor(() => expect(screen.queryByText(/Not saved/)).toBeNull(), { timeout: 10_000 });
  });

  it("a stale edit (409) tells the user it was changed by someone else and reloads", async () => {
    let gets = 0;
    mount((url, init) => {
      if (!init?.method) {
        gets += 1;
        return reply(200, { visit: VISIT, lesions: [gets === 1 ? L1 : { ...L1, version: 2, grade: "hsil" }] });
      }
      return reply(409, { error: { code: "conflict", message: "Changed since you loaded it." } });
    });
    const shape = await screen.findByRole("button", { name: /^L1: LSIL/ });
    fireEvent.keyDown(shape, { key: "ArrowRight" });
    expect(await screen.findByText(/Changed by someone else — reloaded/)).toBeTruthy();
    await waitFor(() => expect(screen.getByRole("button", { name: /^L1: HSIL/ })).toBeTruthy());
  });

  it("shows impression and histology side by side when they disagree", async () => {
    mount(() => reply(200, { visit: VISIT, lesions: [L1] }));
    fireEvent.click(await screen.findByRole("button", { name: "L1" }));
    // LAST terms (Darragh 2012); the product rule: histology decides the tracked grade.
    expect(await screen.findByText("Impression LSIL · Histology HSIL (histology decides for tracking)")).toBeTruthy();
  });

  it("suspected cancer brings up the caution that histology must confirm it", async () => {
    const spy = mount((url, init) => (init?.method === "PATCH" ? reply(200, { lesion: { ...L1, grade: "suspected_cancer", version: 2 } }) : reply(200, { visit: VISIT, lesions: [L1] })));
    fireEvent.click(await screen.findByRole("button", { name: "L1" }));
    fireEvent.click(await screen.findByRole("radio", { name: /Suspected cancer/ }));
    expect((await screen.findByRole("alert")).textContent).toMatch(/urgent histological confirmation.*clinician decides/);
    await waitFor(() => expect(spy.mock.calls.some(([, i]) => i?.method === "PATCH" && JSON.parse(String(i.body)).version === 1)).toBe(true));
  });

  it("a reader gets no editing controls", async () => {
    mount(() => reply(200, { visit: VISIT, lesions: [L1] }), false);
    expect(await screen.findByText("Read only")).toBeTruthy();
    expect(screen.queryByRole("button", { name: "New lesion" })).toBeNull();
  });
});
