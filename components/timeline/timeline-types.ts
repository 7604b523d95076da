import type { TimelineDto } from "@/db/queries/timeline";

/** JSON turns Dates into strings: the timeline as the browser receives it. */
type Wire<T> = T extends Date ? string : T extends (infer U)[] ? Wire<U>[] : T extends object ? { [K in keyof T]: Wire<T[K]> } : T;

export type Timeline = Wire<TimelineDto>;
export type TimelineVisit = Timeline["visits"][number];
export type TimelineLesion = Timeline["lesions"][number];
export type TimelineStatus = Timeline["statuses"][number];
export type TimelineReview = Timeline["reviews"][number];
export type TimelineAdjudication = TimelineReview["adjudications"][number];

export const timelineUrl = (patientId: string) => `/api/patients/${patientId}/timeline`;

/** The track label where there is one: the name that stays the same from visit to visit. */
export function trackLabelOf(t: Timeline, trackId: string | null): string | null {
  if (!trackId) return null;
  return t.tracks.find((x) => x.id === trackId)?.label ?? null;
}
