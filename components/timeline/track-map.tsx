"use client";

import { useMemo, type PointerEvent as ReactPointerEvent } from "react";
import { CanalMap, sectorOf, sectorPath, type MapLesion } from "@/components/canal-map";
import type { DisplayConvention } from "@/lib/geometry";
import type { TimelineLesion } from "./timeline-types";

export type TrackLesion = TimelineLesion & { trackLabel: string | null };

/** What the map draws for a timeline lesion: the effective grade, named by its track. */
export function toMapLesion(l: TrackLesion): MapLesion {
  return {
    id: l.id,
    label: l.trackLabel ?? l.label,
    grade: l.effectiveGrade,
    clockStartH: l.clockStartH,
    clockEndH: l.clockEndH,
    distanceStartCm: l.distanceStartCm,
    distanceEndCm: l.distanceEndCm,
    treated: l.treated,
    biopsyLabels: l.biopsyLabels,
  };
}

function lesionIdFromEvent(e: ReactPointerEvent<Element>): string | null {
  const el = (e.target as Element | null)?.closest?.("[data-lesion-id]");
  return el?.getAttribute("data-lesion-id") ?? null;
}

/**
 * The read-only canal map with selection and hover by TRACK: the map selects lesions, so the
 * selected track is turned into this visit's lesion of that track, and hover is read from the
 * lesion under the pointer (the map draws; this wrapper decides what a track is).
 */
export function TrackMap(props: {
  lesions: readonly TrackLesion[];
  convention: DisplayConvention;
  title: string;
  selectedTrackId: string | null;
  hoveredTrackId?: string | null;
  onSelectTrack?: (trackId: string | null) => void;
  onHoverTrack?: (trackId: string | null) => void;
  /** Small multiples: a heavier ring round the selected track, so it reads at thumbnail size. */
  emphasiseSelected?: boolean;
}) {
  const { lesions, convention, selectedTrackId, hoveredTrackId, onSelectTrack, onHoverTrack } = props;
  const mapLesions = useMemo(() => lesions.map(toMapLesion), [lesions]);
  const trackOf = useMemo(() => new Map(lesions.map((l) => [l.id, l.trackId])), [lesions]);
  const selectedId = lesions.find((l) => selectedTrackId && l.trackId === selectedTrackId)?.id ?? null;
  const hovered = hoveredTrackId && hoveredTrackId !== selectedTrackId ? mapLesions.find((l) => trackOf.get(l.id) === hoveredTrackId) : undefined;
  const select = (lesionId: string) => {
    const t = trackOf.get(lesionId) ?? null;
    onSelectTrack?.(t && t === selectedTrackId ? null : t);
  };
  return (
    <CanalMap
      lesions={mapLesions}
      convention={convention}
      selectedId={selectedId}
      title={props.title}
      focusable={Boolean(onSelectTrack)}
      onLesionPointerDown={onSelectTrack ? (id) => select(id) : undefined}
      onLesionKeyDown={onSelectTrack ? (id, e) => { if (e.key === "Enter" || e.key === " ") { e.preventDefault(); select(id); } } : undefined}
      surfaceProps={onHoverTrack ? {
        onPointerOver: (e) => { const id = lesionIdFromEvent(e); onHoverTrack(id ? (trackOf.get(id) ?? null) : null); },
        onPointerLeave: () => onHoverTrack(null),
      } : undefined}
      overlay={
        <g pointerEvents="none">
          {props.emphasiseSelected && selectedId ? (
            <path d={sectorPath(sectorOf(mapLesions.find((l) => l.id === selectedId)!, convention, 14)) ?? ""} fill="none" stroke="var(--color-lagoon-600)" strokeWidth={10} data-emphasis-ring={selectedId} />
          ) : null}
          {hovered ? (
            <path d={sectorPath(sectorOf(hovered, convention, 10)) ?? ""} fill="none" stroke="var(--color-ink)" strokeWidth={3} strokeDasharray="3 4" data-hover-ring={hovered.id} />
          ) : null}
        </g>
      }
    />
  );
}
