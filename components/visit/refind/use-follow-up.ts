"use client";
// The follow-up context of a visit (earlier tracks, marks made here, suggested links) and the
// actions on it. Every action answers with the refreshed context; the lesions key is refreshed
// too, because a link, split or merge changes the track a lesion shows.
import { useCallback, useMemo, useState } from "react";
import useSWR, { useSWRConfig } from "swr";
import { ApiError, fetcher, sendJson } from "@/components/data/fetcher";
import type { Grade, Histology, TrackCheckOutcome, Zone } from "@/lib/domain/vocab";
import type { LesionDto } from "@/lib/validation/lesions";
import type { TrackAction } from "@/lib/validation/tracking";
import { api } from "@/components/data/keys";

export type CheckOutcome = TrackCheckOutcome;

/** The last sighting of one earlier track, as GET /api/visits/:id/tracks returns it. */
export interface GhostDto {
  lesionId: string;
  trackId: string;
  trackLabel: string;
  visitDate: string;
  label: string;
  clockStartH: number;
  clockEndH: number;
  distanceStartCm: number;
  distanceEndCm: number;
  zone: Zone;
  /** The grade it counts as (histology decides over the impression), as the compare page shows it. */
  grade: Grade;
  impression: Grade;
  histology: Histology | null;
  foundHere: boolean;
  checkHere: CheckOutcome | null;
}
export interface SuggestionDto { trackId: string; lesionId: string; score: number; explanation: string }
export interface FollowUpDto {
  visit: { id: string; status: string; visitDate: string };
  ghosts: GhostDto[];
  suggestions: SuggestionDto[];
  unmatchedLesionIds: string[];
  /** Fresh lesions an examiner decided are new (no longer offered for linking), with who and when. */
  keptNew: { lesionId: string; decidedBy: string; decidedAt: string }[];
}
export type ActionNote = { tone: "ok" | "danger"; text: string };

export const tracksKey = (visitId: string) => api.visitPart(visitId, "tracks");
export const lesionsKey = (visitId: string) => api.visitPart(visitId, "lesions");

export function failureText(err: unknown): string {
  if (err instanceof ApiError) {
    const first = err.fields ? Object.values(err.fields)[0]?.[0] : undefined;
    return first ?? err.message;
  }
  return "Unexpected error.";
}

export function useFollowUp(visitId: string) {
  const key = tracksKey(visitId);
  const swr = useSWR<FollowUpDto>(key, fetcher, { keepPreviousData: true });
  const { mutate } = useSWRConfig();
  const setContext = swr.mutate;
  const [busy, setBusy] = useState(false);
  const [note, setNote] = useState<ActionNote | null>(null);

  const refreshLesions = useCallback(() => mutate(lesionsKey(visitId)), [mutate, visitId]);

  /** One action; the server's refreshed context replaces ours. Returns whether it worked. */
  const act = useCallback(
    async (action: TrackAction, done: string): Promise<boolean> => {
      setBusy(true);
      try {
        const next = await sendJson<FollowUpDto>("POST", key, action);
        await setContext(next, { revalidate: false });
        setNote({ tone: "ok", text: done });
        return true;
      } catch (err) {
        setNote({ tone: "danger", text: `Not done: ${failureText(err)}` });
        void setContext();
        return false;
      } finally {
        void refreshLesions();
        setBusy(false);
      }
    },
    [key, setContext, refreshLesions],
  );

  /**
   * Found at its old place: a lesion is drawn where the ghost is, then linked, in one go. It starts
   * from the earlier impression (this visit's histology is not known yet).
   */
  const foundAtGhost = useCallback(
    async (g: GhostDto): Promise<boolean> => {
      setBusy(true);
      let created: LesionDto | null = null;
      try {
        const extent = { clockStartH: g.clockStartH, clockEndH: g.clockEndH, distanceStartCm: g.distanceStartCm, distanceEndCm: g.distanceEndCm, grade: g.impression };
        created = (await sendJson<{ lesion: LesionDto }>("POST", lesionsKey(visitId), extent)).lesion;
        const next = await sendJson<FollowUpDto>("POST", key, { action: "link", lesionId: created.id, trackId: g.trackId });
        await setContext(next, { revalidate: false });
        setNote({ tone: "ok", text: `${g.trackLabel} found: lesion ${created.label} added at its earlier place and linked. Adjust its extent and grade if it changed.` });
        return true;
      } catch (err) {
        const what = created ? `Lesion ${created.label} was added but not linked to ${g.trackLabel}: ${failureText(err)} Link it from the suggestions.` : `Not done: ${failureText(err)}`;
        setNote({ tone: "danger", text: what });
        void setContext();
        return false;
      } finally {
        void refreshLesions();
        setBusy(false);
      }
    },
    [key, setContext, visitId, refreshLesions],
  );

  const ghosts = swr.data?.ghosts;
  const byTrack = useMemo(() => new Map((ghosts ?? []).map((g) => [g.trackId, g])), [ghosts]);

  const clearNote = useCallback(() => setNote(null), []);
  const data = swr.data;
  const error = swr.error as ApiError | undefined;
  // One object per change of what it holds, so memoised panels that take it skip other renders.
  return useMemo(
    () => ({ data, error, byTrack, busy, note, clearNote, setNote, revalidate: setContext, act, foundAtGhost }),
    [data, error, byTrack, busy, note, clearNote, setContext, act, foundAtGhost],
  );
}

export type FollowUp = ReturnType<typeof useFollowUp>;
