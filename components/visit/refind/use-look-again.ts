"use client";
// What the Look again list and the inspector card need: per-track suggestion and found label,
// and the three actions. Kept in one place so both show the same thing.
import { useCallback, useMemo } from "react";
import type { LesionDto } from "@/lib/validation/lesions";
import type { CheckOutcome, FollowUp, GhostDto, SuggestionDto } from "./use-follow-up";

const OUTCOME_WORDS: Record<CheckOutcome, string> = { not_found: "not found", treated: "treated", not_examined: "not examined" };

export function useLookAgain(fu: FollowUp, lesions: readonly LesionDto[]) {
  const { act, foundAtGhost, data } = fu;
  const labelOf = useMemo(() => new Map(lesions.map((l) => [l.id, l.label])), [lesions]);
  const foundAsByTrack = useMemo(() => {
    const m = new Map<string, string>();
    for (const l of lesions) if (l.trackId) m.set(l.trackId, l.label);
    return m;
  }, [lesions]);
  const suggestionByTrack = useMemo(() => {
    const m = new Map<string, SuggestionDto & { lesionLabel: string }>();
    for (const s of data?.suggestions ?? []) m.set(s.trackId, { ...s, lesionLabel: labelOf.get(s.lesionId) ?? "new lesion" });
    return m;
  }, [data?.suggestions, labelOf]);

  const onFound = useCallback(
    (g: GhostDto) => {
      const s = suggestionByTrack.get(g.trackId);
      // A fresh lesion already drawn for this track: accepting it beats drawing a second one.
      if (s) void act({ action: "link", lesionId: s.lesionId, trackId: g.trackId }, `${g.trackLabel} found: lesion ${s.lesionLabel} linked to it.`);
      else void foundAtGhost(g);
    },
    [act, foundAtGhost, suggestionByTrack],
  );
  const onCheck = useCallback(
    (g: GhostDto, outcome: CheckOutcome) => void act({ action: "check", trackId: g.trackId, outcome }, `${g.trackLabel} marked ${OUTCOME_WORDS[outcome]} at this visit.`),
    [act],
  );
  const onUncheck = useCallback((g: GhostDto) => void act({ action: "uncheck", trackId: g.trackId }, `Mark on ${g.trackLabel} undone: it is to look for again.`), [act]);

  return useMemo(
    () => ({ labelOf, foundAsByTrack, suggestionByTrack, onFound, onCheck, onUncheck }),
    [labelOf, foundAsByTrack, suggestionByTrack, onFound, onCheck, onUncheck],
  );
}

export type LookAgain = ReturnType<typeof useLookAgain>;
