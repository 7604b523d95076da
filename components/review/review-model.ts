// Small pure helpers for the compare screen: which visits, which review, which lesions.
import type { TrackCheckOutcome } from "@/lib/domain/vocab";
import type { DiffLesion } from "@/lib/tracking/visit-diff";
import type { Timeline, TimelineReview, TimelineVisit } from "@/components/timeline/timeline-types";
import type { TrackLesion } from "@/components/timeline/track-map";

/** The pair in time order (earlier, later), whatever order they were picked in; default the latest two. */
export function orderedPair(visits: readonly TimelineVisit[], a?: string | null, b?: string | null): [TimelineVisit, TimelineVisit] | null {
  const idx = (id?: string | null) => visits.findIndex((v) => v.id === id);
  let i = idx(a);
  let j = idx(b);
  if (i < 0 || j < 0 || i === j) {
    if (visits.length < 2) return null;
    i = visits.length - 2;
    j = visits.length - 1;
  }
  return i < j ? [visits[i]!, visits[j]!] : [visits[j]!, visits[i]!];
}

/**
 * The review of this pair (the later visit reviewed against the earlier one): the open one if
 * any, else the most recently listed signed-off one.
 */
export function reviewForPair(reviews: readonly TimelineReview[], earlierId: string, laterId: string): TimelineReview | null {
  const mine = reviews.filter((r) => r.visitId === laterId && r.comparedVisitId === earlierId);
  return mine.find((r) => r.status !== "signed_off") ?? mine[mine.length - 1] ?? null;
}

export function toDiffLesion(l: TrackLesion): DiffLesion {
  return {
    id: l.id,
    trackId: l.trackId,
    name: l.trackLabel ?? l.label,
    clockStartH: l.clockStartH,
    clockEndH: l.clockEndH,
    distanceStartCm: l.distanceStartCm,
    distanceEndCm: l.distanceEndCm,
    grade: l.effectiveGrade,
  };
}

/** Outcomes recorded at a visit for earlier tracks (not found, treated, not examined), by track. */
export function checksAt(t: Timeline, visitId: string): Record<string, TrackCheckOutcome> {
  return Object.fromEntries(t.checks.filter((c) => c.visitId === visitId).map((c) => [c.trackId, c.outcome]));
}

export const compareHref = (patientId: string, earlierId: string, laterId: string, trackId?: string | null) =>
  `/patients/${patientId}/compare?a=${earlierId}&b=${laterId}${trackId ? `&track=${trackId}` : ""}`;
