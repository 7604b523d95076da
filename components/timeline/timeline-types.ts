import type { Timeline, TimelineWire } from "@/lib/api/types";
import { api } from "@/components/data/keys";
import { fetcher } from "@/components/data/fetcher";
import { decodeTimeline } from "@/lib/timeline/wire";

export type { Timeline };
export type TimelineVisit = Timeline["visits"][number];
export type TimelineLesion = Timeline["lesions"][number];
export type TimelineStatus = Timeline["statuses"][number];
export type TimelineReview = Timeline["reviews"][number];
export type TimelineAdjudication = TimelineReview["adjudications"][number];

export const timelineUrl = (patientId: string) => api.timeline(patientId);

/** SWR's fetcher for the timeline: it travels in columns (lib/timeline/wire) and is read as rows. */
export const timelineFetcher = (url: string): Promise<Timeline> => fetcher<TimelineWire>(url).then((w) => decodeTimeline<Timeline>(w));

/** The track label where there is one: the name that stays the same from visit to visit. */
export function trackLabelOf(t: Timeline, trackId: string | null): string | null {
  if (!trackId) return null;
  return t.tracks.find((x) => x.id === trackId)?.label ?? null;
}
