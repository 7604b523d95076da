"use client";

import type { DiffKind, VisitDifference } from "@/lib/tracking/visit-diff";

export const DIFF_KIND_LABEL: Record<DiffKind, string> = {
  new: "New",
  gone: "Gone",
  grade: "Changed grade",
  moved: "Moved",
};

/** A short ink mark per kind, beside the word, so the list reads the same in greyscale. */
const DIFF_KIND_MARK: Record<DiffKind, string> = { new: "+", gone: "−", grade: "↕", moved: "→" };

/**
 * Differences between the two visits, in words. Each item selects its track on both maps;
 * pointing at one rings the track on both maps.
 */
export function DifferencesList(props: {
  differences: readonly VisitDifference[];
  selectedTrackId: string | null;
  onSelectTrack: (trackId: string | null) => void;
  onHoverTrack?: (trackId: string | null) => void;
}) {
  const { differences, selectedTrackId, onSelectTrack, onHoverTrack } = props;
  if (differences.length === 0) {
    return <p className="text-sm text-ink-soft">No differences: the same tracks, at the same grades and places (within 1 hour and 1 cm).</p>;
  }
  return (
    <ul className="space-y-1" aria-label="Differences between the two visits">
      {differences.map((d) => {
        const selected = Boolean(d.trackId) && d.trackId === selectedTrackId;
        return (
          <li key={`${d.kind}-${d.key}`} data-diff-kind={d.kind}>
            <button
              type="button"
              aria-pressed={selected}
              disabled={!d.trackId}
              onClick={() => onSelectTrack(selected ? null : d.trackId)}
              onPointerEnter={() => onHoverTrack?.(d.trackId)}
              onPointerLeave={() => onHoverTrack?.(null)}
              onFocus={() => onHoverTrack?.(d.trackId)}
              onBlur={() => onHoverTrack?.(null)}
              className={`flex min-h-11 w-full items-start gap-2 rounded-md border px-3 py-2 text-left text-sm ${selected ? "border-lagoon-600 bg-lagoon-50" : "border-rule bg-panel hover:bg-lagoon-50"}`}
            >
              <span aria-hidden="true" className="w-4 shrink-0 text-center font-bold">{DIFF_KIND_MARK[d.kind]}</span>
              <span className="w-28 shrink-0 font-bold">{DIFF_KIND_LABEL[d.kind]}</span>
              <span>{d.words}</span>
            </button>
          </li>
        );
      })}
    </ul>
  );
}
