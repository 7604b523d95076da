import { afterEach, describe, expect, it, vi } from "vitest";
import { act, fireEvent, render, screen, waitFor } from "@testing-library/react";
import { SWRConfig } from "swr";
import type { LesionDto, VisitMapDto } from "@/lib/validation/lesions";
import { BiopsiesPanel } from "./biopsies-panel";

// The network is faked (fetch is the DOM boundary); what is checked is what the user sees.
const VISIT: VisitMapDto["visit"] = { id: "v1", patientId: "p1", visitDate: "2026-01-02", status: "draft", patientPosition: "lithotomy", readOnly: false };
const lesion = (id: string, label: string, grade: LesionDto["grade"]): LesionDto => ({
  id, visitId: "v1", trackId: null, trackLabel: null, label, clockStartH: 1, clockEndH: 3, distanceStartCm: 1, distanceEndCm: 2, zone: "distal_canal",
  grade, morphology: null, acetowhite: null, lugol: null, vessels: [], sizeMm: null, note: null, version: 1, histology: null, biopsyLabels: [], treated: false,
});
const L1 = lesion("l1", "L1", "hsil");
const L2 = lesion("l2", "L2", "condyloma");

const reply = (status: number, body: unknown) => Promise.resolve(new Response(JSON.stringify(body), { status, headers: { "content-type": "application/json" } }));

afterEach(() => vi.unstubAllGlobals());

describe("BiopsiesPanel", { timeout: 20_000 }, () => {
  it("a lesion picked for the next specimen while the lists reload stays picked", async () => {
    const taken: string[] = [];
    let lesionGets = 0;
    let releaseLesions: () => void = () => {};
    vi.stubGlobal("fetch", vi.fn((url: string, init?: RequestInit) => {
      if (init?.method === "POST") {
        taken.push((JSON.parse(String(init.body)) as { lesionId: string }).lesionId);
        return reply(201, { biopsy: { id: "b1" } });
      }
      if (url.endsWith("/biopsies")) {
        const biopsies = taken.map((lesionId, i) => ({ id: `b${i}`, specimenLabel: "AB"[i], lesionId, lesionLabel: lesionId.toUpperCase(), clockH: 2, distanceCm: 1.5, histology: null, ainGrade: null, p16: null }));
        return reply(200, { biopsies });
      }
      // The visit's lesions: the reload after the first specimen answers only when released.
      lesionGets += 1;
      const body = { visit: VISIT, lesions: [L1, L2] };
      return lesionGets === 1 ? reply(200, body) : new Promise<Response>((r) => { releaseLesions = () => r(new Response(JSON.stringify(body), { status: 200 })); });
    }));
    render(
      <SWRConfig value={{ provider: () => new Map(), dedupingInterval: 0 }}>
        <BiopsiesPanel visitId="v1" canEdit canEnterResults={false} />
      </SWRConfig>,
    );
    const pick = screen.getByLabelText("From lesion") as HTMLSelectElement;
    await screen.findByRole("option", { name: /^L2/ });
    fireEvent.change(pick, { target: { value: "l1" } });
    fireEvent.click(screen.getByRole("button", { name: "Take biopsy" }));
    expect(await screen.findByText("Specimen A")).toBeTruthy();
    // The specimen list is back; the lesion list is still reloading. The user picks the next one.
    fireEvent.change(pick, { target: { value: "l2" } });
    await act(async () => releaseLesions());
    await waitFor(() => expect(screen.getByRole("button", { name: "Take biopsy" }).hasAttribute("disabled")).toBe(false));
    expect(pick.value).toBe("l2");
    fireEvent.click(screen.getByRole("button", { name: "Take biopsy" }));
    await waitFor(() => expect(taken).toEqual(["l1", "l2"]));
  });
});
