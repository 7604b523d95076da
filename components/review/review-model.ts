// Small pure helpers for the compare screen: which visits, which review, which lesions.
import type { TrackCheckOutcome } from "@/lib/domain/vocab";
import type { DiffLesion } from "@/lib/tracking/visit-diff";
import type { Timeline, TimelineReview, TimelineVisit } from "@/components/timeline/timeline-types";
import type { TrackLesion } from "@/components/timeline/track-map";

/** The latest two signed visits, oldest first; null with fewer than two. A draft is never a default. */
export function latestSignedPair<V extends Pick<TimelineVisit, "status">>(visits: readonly V[]): [V, V] | null {
  const signed = visits.filter((v) => v.status === "signed");
  return signed.length < 2 ? null : [signed[signed.length - 2]!, signed[signed.length - 1]!];
}

/**
 * The pair in time order (earlier, later), whatever order they were picked in. Two visits picked
 * are kept, drafts included (the pickers say which are drafts); otherwise the latest two signed
 * visits: a draft has no statuses yet and would compare as if nothing were found.
 */
export function orderedPair(visits: readonly TimelineVisit[], a?: string | null, b?: string | null): [TimelineVisit, TimelineVisit] | null {
  const idx = (id?: string | null) => visits.findIndex((v) => v.id === id);
  const i = idx(a);
  const j = idx(b);
  if (i < 0 || j < 0 || i === j) return latestSignedPair(visits);
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
