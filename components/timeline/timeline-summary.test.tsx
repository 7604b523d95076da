import { describe, expect, it } from "vitest";
import { render, screen } from "@testing-library/react";
import { summarizeTimeline, timeSinceWords } from "./timeline-summary";
import { SummaryPanel } from "./summary-panel";
import type { Timeline } from "./timeline-types";

// A worked history, written by hand:
// 2025-01-10: T1 HSIL (treated at this visit). 2025-07-10: T1 not found after treatment (cleared),
// T2 LSIL new. 2026-01-10: T1 found again at the treated site (recurrent), histology SCC, so its
// effective grade is suspected cancer (histology decides: Darragh 2012 LAST; SCC mapped to the
// top of the impression scale); T2 persistent LSIL.
// Cleared / recurrent as defined in Liu Y et al., Papillomavirus Res 2018 (Liu 2018; recurrent: common practice).
const v = (id: string, visitDate: string) => ({ id, visitDate, status: "signed" as const, patientPosition: "lithotomy" as const, examiner: "Dr A", examinerId: "u1" });
const lesion = (id: string, visitId: string, trackId: string, effectiveGrade: "lsil" | "hsil" | "suspected_cancer", treated = false) => ({
  id, visitId, trackId, label: "L1", clockStartH: 1, clockEndH: 2, distanceStartCm: 1, distanceEndCm: 2, zone: "distal_canal" as const,
  grade: effectiveGrade === "suspected_cancer" ? ("hsil" as const) : effectiveGrade, version: 1, histology: null, effectiveGrade, biopsyLabels: [], treated,
});
const timeline = {
  patient: { id: "p", siteId: "s", name: "Doe, A", mrn: "1" },
  visits: [v("v1", "2025-01-10"), v("v2", "2025-07-10"), v("v3", "2026-01-10")],
  tracks: [{ id: "t1", label: "T1" }, { id: "t2", label: "T2" }],
  lesions: [lesion("a", "v1", "t1", "hsil", true), lesion("b", "v2", "t2", "lsil"), lesion("c", "v3", "t1", "suspected_cancer"), lesion("d", "v3", "t2", "lsil")],
  statuses: [
    { trackId: "t1", visitId: "v1", status: "new" as const, effectiveGrade: "hsil" as const, reason: "first" },
    { trackId: "t1", visitId: "v2", status: "cleared" as const, effectiveGrade: null, reason: "not found after treatment" },
    { trackId: "t1", visitId: "v3", status: "recurrent" as const, effectiveGrade: "suspected_cancer" as const, reason: "found again" },
    { trackId: "t2", visitId: "v2", status: "new" as const, effectiveGrade: "lsil" as const, reason: "first" },
    { trackId: "t2", visitId: "v3", status: "persistent" as const, effectiveGrade: "lsil" as const, reason: "same" },
  ],
  checks: [{ visitId: "v2", trackId: "t1", outcome: "not_found" as const }],
  perVisit: [],
  reviews: [],
} as unknown as Timeline;

describe("summarizeTimeline", () => {
  const s = summarizeTimeline(timeline);
  it("counts tracks by their latest status", () => {
    expect(s.countsByStatus.recurrent).toBe(1);
    expect(s.countsByStatus.persistent).toBe(1);
    expect(s.countsByStatus.cleared).toBe(0);
  });
  it("finds the last HSIL or worse at the latest visit where one was seen", () => {
    expect(s.lastHsilOrWorse).toEqual({ visitDate: "2026-01-10", trackLabels: ["T1"] });
  });
  it("lists treated sites with the visit they were treated at", () => {
    expect(s.treated).toEqual([{ trackId: "t1", label: "T1", visitDates: ["2025-01-10"] }]);
  });
  it("flags a track whose current effective grade is suspected cancer", () => {
    expect(s.suspectedCancer).toEqual(["T1"]);
  });
});

describe("summarizeTimeline with a draft after the signed visits", () => {
  // The same history plus an unsigned draft (2026-06-01) holding an HSIL lesion on T2, a treatment
  // and a "not found" mark on T1: a draft is work in progress and changes nothing in the summary.
  const withDraft = {
    ...timeline,
    visits: [...timeline.visits, { ...v("v4", "2026-06-01"), status: "draft" as const }],
    lesions: [...timeline.lesions, lesion("e", "v4", "t2", "hsil", true)],
    statuses: [...timeline.statuses, { trackId: "t1", visitId: "v4", status: "cleared" as const, effectiveGrade: null, reason: "draft" }],
    checks: [...timeline.checks, { visitId: "v4", trackId: "t1", outcome: "not_found" as const }],
  } as unknown as Timeline;
  const d = summarizeTimeline(withDraft);
  it("keeps each track's status at its latest signed visit", () => {
    expect(d.countsByStatus.cleared).toBe(0);
    expect(d.current.map((c) => [c.label, c.status, c.visitDate])).toEqual([["T1", "recurrent", "2026-01-10"], ["T2", "persistent", "2026-01-10"]]);
  });
  it("takes neither the draft's findings nor its treatment", () => {
    expect(d.lastHsilOrWorse).toEqual({ visitDate: "2026-01-10", trackLabels: ["T1"] });
    expect(d.treated).toEqual([{ trackId: "t1", label: "T1", visitDates: ["2025-01-10"] }]);
  });
});

describe("timeSinceWords (calendar months counted by hand)", () => {
  it("2025-01-15 to 2026-03-20 is 1 year 2 months", () => expect(timeSinceWords("2025-01-15", "2026-03-20")).toBe("1 year 2 months"));
  it("a month not yet complete does not count: 2025-01-31 to 2025-02-27 is 27 days", () => expect(timeSinceWords("2025-01-31", "2025-02-27")).toBe("27 days"));
  it("exactly six months", () => expect(timeSinceWords("2025-03-01", "2025-09-01")).toBe("6 months"));
});

describe("SummaryPanel: last HSIL or worse", () => {
  const summary = summarizeTimeline(timeline);
  it("says how long ago (2026-01-10 to 2026-07-10: 6 calendar months, counted by hand)", () => {
    render(<SummaryPanel summary={summary} todayIso="2026-07-10" />);
    expect(screen.getByText("6 months").parentElement!.textContent).toMatch(/^6 months ago/);
  });
  it("says a visit dated after today is so, and not 'in the future ago'", () => {
    const { container } = render(<SummaryPanel summary={summary} todayIso="2025-12-01" />);
    expect(screen.getByText("Dated after today")).toBeTruthy();
    expect(container.textContent).not.toMatch(/ago/);
  });
});
