import { afterEach, describe, expect, it, vi } from "vitest";
import { fireEvent, render, screen, waitFor, within } from "@testing-library/react";
import { SWRConfig } from "swr";
import type { FollowUpDto, GhostDto } from "@/components/visit/refind/use-follow-up";
import type { VisitRecordDto } from "./use-visit-record";
import { SigningPanel } from "./signing-panel";

// Signing a follow-up visit, against a faked server (fetch is the boundary). An earlier track
// left undecided would be read as looked for and not found, which after treatment counts as
// cleared; so the prompt lists each undecided track with its own decision, and the visit cannot
// be signed until every one has one (the server refuses too: tests/integration/signing-undecided-tracks).
const T1 = "11111111-1111-4111-8111-111111111111";
const T2 = "22222222-2222-4222-8222-222222222222";
const T3 = "33333333-3333-4333-8333-333333333333";
const ghost = (trackId: string, trackLabel: string, over: Partial<GhostDto> = {}): GhostDto => ({
  lesionId: `old-${trackLabel}`, trackId, trackLabel, visitDate: "2027-01-10", label: "L1", clockStartH: 2, clockEndH: 3, distanceStartCm: 1, distanceEndCm: 2,
  zone: "distal_canal", grade: "hsil", impression: "hsil", histology: null, foundHere: false, checkHere: null, ...over,
});
const context = (ghosts: GhostDto[]): FollowUpDto => ({ visit: { id: "v2", status: "draft", visitDate: "2027-07-01" }, ghosts, suggestions: [], unmatchedLesionIds: [], keptNew: [] });
const VISIT = { id: "v2", patientId: "p1", siteId: "s1", visitDate: "2027-07-01", status: "draft", examinerId: "u1", examinerName: "Dr Vale", patientPosition: "lithotomy" } as VisitRecordDto;
const reply = (status: number, body: unknown) => Promise.resolve(new Response(JSON.stringify(body), { status, headers: { "content-type": "application/json" } }));

afterEach(() => vi.unstubAllGlobals());

function mount() {
  let ctx = context([ghost(T1, "#1"), ghost(T2, "#2", { grade: "lsil", impression: "lsil", clockStartH: 7, clockEndH: 8 }), ghost(T3, "#3", { checkHere: "not_found" })]);
  const spy = vi.fn((url: string, init?: RequestInit) => {
    if (url.endsWith("/tracks") && init?.method === "POST") {
      const a = JSON.parse(String(init.body)) as { trackId: string; outcome: GhostDto["checkHere"] };
      ctx = context(ctx.ghosts.map((g) => (g.trackId === a.trackId ? { ...g, checkHere: a.outcome } : g)));
      return reply(200, ctx);
    }
    if (url.endsWith("/tracks")) return reply(200, ctx);
    if (url.endsWith("/lesions")) return reply(200, { lesions: [] });
    if (url.endsWith("/sign")) return reply(200, { id: "v2", status: "signed" });
    return reply(200, {});
  });
  vi.stubGlobal("fetch", spy);
  render(
    <SWRConfig value={{ provider: () => new Map(), dedupingInterval: 0 }}>
      <SigningPanel visit={VISIT} permissions={{ canEdit: true, canSign: true, canAddAddendum: false }} conv="lithotomy" />
    </SWRConfig>,
  );
  return spy;
}
const posts = (spy: ReturnType<typeof mount>) => spy.mock.calls.filter(([, i]) => i?.method === "POST").map(([u, i]) => [u, i!.body ? JSON.parse(String(i!.body)) : null]);

describe("signing prompt with earlier tracks still to look for", { timeout: 20_000 }, () => {
  it("lists each undecided track with found / not found / not examined, and holds the signature until all are decided", async () => {
    const spy = mount();
    fireEvent.click(screen.getByRole("button", { name: "Sign visit…" }));
    expect(await screen.findByRole("heading", { name: "Before signing: 2 earlier tracks are still to look for" })).toBeTruthy();
    const items = () => [...document.querySelectorAll("[data-undecided]")].map((el) => el.getAttribute("data-undecided"));
    expect(items()).toEqual(["#1", "#2"]);
    for (const label of ["#1", "#2"]) {
      const group = within(screen.getByRole("group", { name: `Decision for ${label}` }));
      for (const what of ["Found", "Not found", "Not examined"]) expect(group.getByRole("button", { name: `${what} ${label}` })).toBeTruthy();
    }
    // The caution says what an undecided track would become, and what "not examined" means.
    expect(screen.getByText(/would be read as looked for and not found, which after treatment counts as cleared/)).toBeTruthy();
    expect(screen.getByText(/is not counted as clear/)).toBeTruthy();
    // The decided one is listed as such; the signature waits for the other two.
    expect(document.querySelector("[data-decided]")!.textContent).toMatch(/#3 looked for, not found/);
    const signBtn = screen.getByRole("button", { name: "Yes, sign this visit" }) as HTMLButtonElement;
    expect(signBtn.disabled).toBe(true);
    expect(screen.getByText("Signing waits for a decision on #1, #2.")).toBeTruthy();

    fireEvent.click(screen.getByRole("button", { name: "Not examined #1" }));
    await waitFor(() => expect(items()).toEqual(["#2"]));
    expect(signBtn.disabled).toBe(true);
    // One decision at a time: the buttons wait while the first is sent.
    await waitFor(() => expect((screen.getByRole("button", { name: "Not found #2" }) as HTMLButtonElement).disabled).toBe(false));
    fireEvent.click(screen.getByRole("button", { name: "Not found #2" }));
    await waitFor(() => expect(items()).toEqual([]));
    expect(document.querySelector("[data-decided]")!.textContent).toMatch(/#1 not examined; #2 looked for, not found; #3 looked for, not found/);

    await waitFor(() => expect((screen.getByRole("button", { name: "Yes, sign this visit" }) as HTMLButtonElement).disabled).toBe(false));
    fireEvent.click(screen.getByRole("button", { name: "Yes, sign this visit" }));
    await waitFor(() => expect(posts(spy).some(([u]) => String(u).endsWith("/sign"))).toBe(true));
    expect(posts(spy)).toEqual([
      ["/api/visits/v2/tracks", { action: "check", trackId: T1, outcome: "not_examined" }],
      ["/api/visits/v2/tracks", { action: "check", trackId: T2, outcome: "not_found" }],
      ["/api/visits/v2/sign", null],
    ]);
  });
});
