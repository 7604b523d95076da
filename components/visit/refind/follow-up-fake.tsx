import { vi } from "vitest";
import { render, waitFor } from "@testing-library/react";
import { SWRConfig } from "swr";
import type { LesionDto, VisitMapDto } from "@/lib/validation/lesions";
import { VisitMapEditor } from "@/components/visit/map-editor/visit-map-editor";
import type { FollowUpDto, GhostDto } from "./use-follow-up";

// The follow-up screen against a faked server (fetch is the boundary). What is checked is the
// request each control sends and what the clinician sees; the matching and status rules
// themselves are the server's and are tested in lib/tracking and tests/integration.
export const T1 = "11111111-1111-4111-8111-111111111111";
export const T3 = "33333333-3333-4333-8333-333333333333";
export const T9 = "99999999-9999-4999-8999-999999999999";
export const NEW_LESION = "44444444-4444-4444-8444-444444444444";
export const VISIT = (readOnly: boolean): VisitMapDto["visit"] => ({ id: "v2", patientId: "p1", visitDate: "2027-07-01", status: readOnly ? "signed" : "draft", patientPosition: "lithotomy", readOnly });
export const ghost = (trackId: string, trackLabel: string, over: Partial<GhostDto> = {}): GhostDto => ({
  lesionId: `old-${trackLabel}`, trackId, trackLabel, visitDate: "2027-01-10", label: "L1", clockStartH: 2.5, clockEndH: 3.5, distanceStartCm: 1, distanceEndCm: 2,
  zone: "distal_canal", grade: "hsil", impression: over.grade ?? "hsil", histology: null, foundHere: false, checkHere: null, ...over,
});
export const FRESH: LesionDto = {
  id: NEW_LESION, visitId: "v2", trackId: T9, trackLabel: "T9", label: "L1", clockStartH: 8.5, clockEndH: 9.5, distanceStartCm: 1, distanceEndCm: 2, zone: "distal_canal",
  grade: "lsil", morphology: null, acetowhite: null, lugol: null, vessels: [], sizeMm: null, note: null, version: 1, histology: null, biopsyLabels: [], treated: false,
};
export const CONTEXT: FollowUpDto = {
  visit: { id: "v2", status: "draft", visitDate: "2027-07-01" },
  ghosts: [ghost(T1, "T1"), ghost(T3, "T3", { clockStartH: 8.5, clockEndH: 9.5, grade: "lsil", label: "L3" })],
  suggestions: [{ trackId: T3, lesionId: NEW_LESION, score: 0.9, explanation: "overlaps 100% of T3's arc, distances overlap 100%, same zone" }],
  unmatchedLesionIds: [],
  keptNew: [],
};
export const NO_TREATMENTS = { treatments: [], extent: { fraction: 0, level: "ok", message: "" }, cautionFraction: 0.5 };

export function reply(status: number, body: unknown) {
  return Promise.resolve(new Response(JSON.stringify(body), { status, headers: { "content-type": "application/json" } }));
}

export type Handler = (url: string, init?: RequestInit) => Promise<Response> | undefined;
export function mount({ readOnly = false, context = CONTEXT, lesions = [FRESH], treatments = NO_TREATMENTS, on }: { readOnly?: boolean; context?: FollowUpDto; lesions?: LesionDto[]; treatments?: unknown; on?: Handler } = {}) {
  const spy = vi.fn((url: string, init?: RequestInit) => {
    const custom = on?.(url, init);
    if (custom) return custom;
    if (url.endsWith("/tracks")) return reply(200, context);
    if (url.endsWith("/treatments")) return reply(200, treatments);
    if (url.endsWith("/lesions") && !init?.method) return reply(200, { visit: VISIT(readOnly), lesions });
    return reply(500, { error: { code: "unexpected", message: `No fake for ${init?.method ?? "GET"} ${url}` } });
  });
  vi.stubGlobal("fetch", spy);
  render(
    <SWRConfig value={{ provider: () => new Map(), dedupingInterval: 0 }}>
      <VisitMapEditor visitId="v2" initialConvention="lithotomy" canEdit />
    </SWRConfig>,
  );
  return spy;
}
export const writes = (spy: ReturnType<typeof mount>) => spy.mock.calls.filter(([, i]) => i?.method).map(([u, i]) => ({ url: u, method: i!.method, body: i!.body ? JSON.parse(String(i!.body)) : undefined }));
/** Waits until the selector finds something (waitFor only retries when the callback throws). */
export async function until(selector: string): Promise<HTMLElement> {
  return waitFor(() => {
    const el = document.querySelector<HTMLElement>(selector);
    if (!el) throw new Error(`Not yet on screen: ${selector}`);
    return el;
  });
}
export const item = (label: string) => document.querySelector<HTMLElement>(`[data-look-again="${label}"]`)!;

