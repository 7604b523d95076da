import { describe, expect, it } from "vitest";
import { render, screen } from "@testing-library/react";
import { summarizeTimeline } from "./timeline-summary";
import { CancerCautions } from "./summary-panel";
import type { Timeline } from "./timeline-types";

// A worked history, written by hand: T1 HSIL at the first visit; at the second visit the impression
// is suspected cancer and the biopsy reads squamous cell carcinoma. T2 carries a suspected-cancer
// impression with no histology yet. Histology decides the grade (Darragh TM et al., LAST, Arch Pathol
// Lab Med 2012): SCC on histology is a confirmed cancer, an impression alone is only a suspicion.
const v = (id: string, visitDate: string) => ({ id, visitDate, status: "signed" as const, patientPosition: "lithotomy" as const, examiner: "Dr A", examinerId: "u1" });
const lesion = (id: string, visitId: string, trackId: string, grade: "hsil" | "suspected_cancer", histology: "scc" | null) => ({
  id, visitId, trackId, label: id, clockStartH: 1, clockEndH: 2, distanceStartCm: 1, distanceEndCm: 2, zone: "distal_canal" as const,
  grade, version: 1, histology, effectiveGrade: histology === "scc" ? ("suspected_cancer" as const) : grade, biopsyLabels: [], treated: false,
});
const timeline = {
  patient: { id: "p", siteId: "s", name: "Doe, A", mrn: "1" },
  visits: [v("v1", "2025-01-10"), v("v2", "2025-07-10")],
  tracks: [{ id: "t1", label: "T1" }, { id: "t2", label: "T2" }],
  lesions: [lesion("a", "v1", "t1", "hsil", null), lesion("b", "v2", "t1", "suspected_cancer", "scc"), lesion("c", "v2", "t2", "suspected_cancer", null)],
  statuses: [
    { trackId: "t1", visitId: "v1", status: "new" as const, effectiveGrade: "hsil" as const, reason: "first" },
    { trackId: "t1", visitId: "v2", status: "progressed" as const, effectiveGrade: "suspected_cancer" as const, reason: "higher grade" },
    { trackId: "t2", visitId: "v2", status: "new" as const, effectiveGrade: "suspected_cancer" as const, reason: "first" },
  ],
  checks: [],
  perVisit: [],
  reviews: [],
} as unknown as Timeline;

describe("confirmed cancer on histology is not shown as suspected", () => {
  const s = summarizeTimeline(timeline);
  it("keeps a track with SCC on histology apart from a suspected-cancer impression", () => {
    // LAST (Darragh 2012): histology decides; SCC on histology is no longer a suspicion.
    expect(s.confirmedCancer).toEqual(["T1"]);
    expect(s.suspectedCancer).toEqual(["T2"]);
  });
  it("shows the referral caution for confirmed cancer and the confirmation caution only for the impression", () => {
    // Common practice, no source: confirmed anal cancer is referred on; a suspicion needs a biopsy first.
    render(<CancerCautions confirmed={s.confirmedCancer} suspected={s.suspectedCancer} />);
    const confirmed = screen.getByText(/carcinoma on histology: T1/i).closest("[role]") ?? screen.getByText(/carcinoma on histology: T1/i).parentElement!;
    expect(confirmed.textContent).toMatch(/refer/i);
    expect(confirmed.textContent).not.toMatch(/histological confirmation/i);
    expect(screen.getByText(/Suspected cancer: T2$/)).toBeTruthy();
    expect(screen.queryByText(/Suspected cancer: .*T1/)).toBeNull();
  });
});
