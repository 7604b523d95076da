"use client";
// The interactive canal map: gestures and keys in, extents out. It holds no server state;
// the owner (VisitMapEditor) saves. Tested on its own in map-editor.test.tsx.
import { memo, useCallback, useEffect, useLayoutEffect, useMemo, useRef, type KeyboardEvent, type PointerEvent } from "react";
import { CanalMap, sectorOf, polar, useSelectedLesion, type SelectionStore, type GhostLesion, type LesionSaveState, type MapExtent, type MapLesion, type TreatedArc } from "@/components/canal-map";
import type { DisplayConvention } from "@/lib/geometry";
import type { Grade } from "@/lib/domain/vocab";
import { moveExtent, resizeArc, resizeDepth, STEP_CM, STEP_H, type HandleKind } from "./extent-math";
import { useMapGestures } from "./use-map-gestures";

export interface MapEditorProps {
  lesions: readonly MapLesion[];
  convention: DisplayConvention;
  readOnly: boolean;
  /** The selected lesion, held outside React state (createSelectionStore): a tap re-renders the
   *  two shapes concerned and the handles, not this editor. onSelect is told of every choice. */
  selection: SelectionStore;
  onSelect: (id: string | null) => void;
  /** A new extent from a tap or a sweep; grade and the rest are the owner's business. */
  onCreate: (extent: MapExtent) => void;
  /** A finished change of an existing lesion's extent (pointerup or a key press). */
  onChange: (id: string, extent: MapExtent) => void;
  onRequestDelete: (id: string) => void;
  saveStates?: Readonly<Record<string, LesionSaveState | undefined>>;
  ghosts?: readonly GhostLesion[];
  /** Selecting an earlier track's outline (follow-up); absent = ghosts are only drawn. */
  onGhostSelect?: (id: string) => void;
  selectedGhostId?: string | null;
  treatedArcs?: readonly TreatedArc[];
  /** A lesion to move keyboard focus to once it is on the map (e.g. after "New lesion"). */
  focusId?: string | null;
  /** Grade the lesion being drawn is shown with (the grade new lesions will get). */
  newGrade?: Grade;
}

export const KEY_HELP = "Tap or drag on the map to add · Tab to a lesion · ← → turn ½ h · ↑ ↓ deeper / shallower ½ cm · Shift + arrows resize · Delete removes · Esc deselects";

const extentOf = (l: MapExtent): MapExtent => ({ clockStartH: l.clockStartH, clockEndH: l.clockEndH, distanceStartCm: l.distanceStartCm, distanceEndCm: l.distanceEndCm });

export function MapEditor(props: MapEditorProps) {
  const { lesions, convention, readOnly, selection, onSelect, onCreate, onChange, onRequestDelete, saveStates, ghosts, onGhostSelect, selectedGhostId, treatedArcs, focusId, newGrade = "lsil" } = props;
  const svgRef = useRef<SVGSVGElement | null>(null);
  const { preview, svgHandlers, startMove, startHandle } = useMapGestures({ svgRef, conv: convention, enabled: !readOnly, onCreate, onChange });

  // Latest values for the stable callbacks handed to memoised lesion shapes.
  // startMove changes with the numbering (it converts coordinates); read through the ref, so a
  // change of numbering does not hand every lesion a new handler.
  const latest = useRef({ lesions, readOnly, startMove });
  useLayoutEffect(() => {
    latest.current = { lesions, readOnly, startMove };
  });
  const find = (id: string) => latest.current.lesions.find((l) => l.id === id);

  const onLesionPointerDown = useCallback(
    (id: string, e: PointerEvent<SVGGElement>) => {
      e.stopPropagation();
      onSelect(id);
      const l = find(id);
      if (l && !latest.current.readOnly) latest.current.startMove(id, extentOf(l), e);
    },
    [onSelect],
  );

  const onLesionKeyDown = useCallback(
    (id: string, e: KeyboardEvent<SVGGElement>) => {
      const l = find(id);
      if (!l) return;
      const key = e.key;
      if (key === "Enter" || key === " ") {
        e.preventDefault();
        onSelect(id);
        return;
      }
      if (key === "Escape") {
        e.preventDefault();
        onSelect(null);
        return;
      }
      if (latest.current.readOnly) return;
      if (key === "Delete" || key === "Backspace") {
        e.preventDefault();
        onRequestDelete(id);
        return;
      }
      const from = extentOf(l);
      let next: MapExtent | null = null;
      // Right turns clockwise on screen; clockwise is clockwise in every convention.
      if (key === "ArrowRight") next = e.shiftKey ? resizeArc(from, STEP_H) : moveExtent(from, STEP_H, 0);
      else if (key === "ArrowLeft") next = e.shiftKey ? resizeArc(from, -STEP_H) : moveExtent(from, -STEP_H, 0);
      else if (key === "ArrowUp") next = e.shiftKey ? resizeDepth(from, STEP_CM) : moveExtent(from, 0, STEP_CM);
      else if (key === "ArrowDown") next = e.shiftKey ? resizeDepth(from, -STEP_CM) : moveExtent(from, 0, -STEP_CM);
      if (!next) return;
      e.preventDefault();
      if (selection.get() !== id) onSelect(id);
      onChange(id, next);
    },
    [onSelect, onChange, onRequestDelete, selection],
  );

  useEffect(() => {
    if (!focusId) return;
    const el = svgRef.current?.querySelector<SVGGElement>(`[data-lesion-id="${focusId}"]`);
    el?.focus();
  }, [focusId, lesions]);

  // While dragging, the moving lesion is drawn from the preview; every other lesion keeps
  // its object identity, so its memoised shape is not redrawn.
  const shown = useMemo(() => {
    if (!preview?.id) return lesions;
    return lesions.map((l) => (l.id === preview.id ? { ...l, ...preview.extent } : l));
  }, [lesions, preview]);
  const draft: MapLesion | null = preview && !preview.id ? { id: "draft", label: "New", grade: newGrade, treated: false, biopsyLabels: [], ...preview.extent } : null;

  return (
    <div className="flex flex-col" onKeyDown={(e) => e.key === "Escape" && onSelect(null)}>
      <div>
        <CanalMap
          lesions={draft ? [...shown, draft] : shown}
          convention={convention}
          selection={selection}
          ghosts={ghosts}
          onGhostSelect={onGhostSelect}
          selectedGhostId={selectedGhostId}
          treatedArcs={treatedArcs}
          saveStates={saveStates}
          onLesionPointerDown={onLesionPointerDown}
          onLesionKeyDown={onLesionKeyDown}
          svgRef={svgRef}
          title={readOnly ? "Canal map (read only)" : "Canal map: tap to add a lesion"}
          surfaceProps={{ ...svgHandlers, style: { touchAction: readOnly ? "auto" : "none" } }}
          overlay={readOnly ? null : <SelectedHandles selection={selection} lesions={shown} conv={convention} onStart={startHandle} />}
        />
      </div>
      <p className="mt-1 text-sm text-ink-soft" id="map-key-help">
        {readOnly ? "Read only: select a lesion with Tab and Enter to see its details." : KEY_HELP}
      </p>
    </div>
  );
}

/**
 * Handles sit outside the lesion, each on a short stalk from the edge it moves, with their whole
 * tap target outside the lesion too: a small lesion stays tappable (to select or move it) however
 * closely its handles crowd. The grip is HANDLE_HIT_R across in viewBox units (about 34 CSS px on
 * a tablet-sized map, above the 24 px minimum of WCAG 2.2, 2.5.8); the dot drawn is smaller.
 */
const HANDLE_R = 6;
export const HANDLE_HIT_R = 22;

/** Where each handle is drawn: its edge's middle, pushed HANDLE_HIT_R out from the lesion. */
export function handleSpots(lesion: MapExtent, conv: DisplayConvention): Array<{ kind: HandleKind; edge: { x: number; y: number }; at: { x: number; y: number } }> {
  const g = sectorOf(lesion, conv);
  const midR = (g.innerRadius + g.outerRadius) / 2;
  const midA = (g.startAngle + g.endAngle) / 2;
  // Turning by asin(d / r) at radius r puts a point d away from the radial edge line.
  const turn = HANDLE_HIT_R < midR ? Math.asin(HANDLE_HIT_R / midR) : Math.PI / 2;
  return [
    { kind: "start", edge: polar(g.startAngle, midR), at: polar(g.startAngle - turn, midR) },
    { kind: "end", edge: polar(g.endAngle, midR), at: polar(g.endAngle + turn, midR) },
    { kind: "inner", edge: polar(midA, g.innerRadius), at: polar(midA, Math.max(0, g.innerRadius - HANDLE_HIT_R)) },
    { kind: "outer", edge: polar(midA, g.outerRadius), at: polar(midA, g.outerRadius + HANDLE_HIT_R) },
  ];
}

type HandleStart = (id: string, h: HandleKind, from: MapExtent, e: PointerEvent) => unknown;

/** Handles on whichever lesion is selected: follows the selection store on its own. */
const SelectedHandles = memo(function SelectedHandles({ selection, lesions, conv, onStart }: { selection: SelectionStore; lesions: readonly MapLesion[]; conv: DisplayConvention; onStart: HandleStart }) {
  const lesion = useSelectedLesion(selection, lesions);
  return lesion ? <Handles lesion={lesion} conv={conv} onStart={onStart} /> : null;
});

const Handles = memo(function Handles({ lesion, conv, onStart }: { lesion: MapLesion; conv: DisplayConvention; onStart: HandleStart }) {
  return (
    <g aria-hidden="true">
      {handleSpots(lesion, conv).map(({ kind, edge, at }) => (
        <g
          key={kind}
          data-handle={kind}
          className="cursor-grab"
          pointerEvents="all"
          onPointerDown={(e) => {
            e.stopPropagation();
            onStart(lesion.id, kind, extentOf(lesion), e);
          }}
        >
          <line x1={edge.x} y1={edge.y} x2={at.x} y2={at.y} stroke="var(--color-lagoon-600)" strokeWidth={2} pointerEvents="none" />
          <circle cx={at.x} cy={at.y} r={HANDLE_HIT_R} fill="transparent" data-handle-hit />
          <circle cx={at.x} cy={at.y} r={HANDLE_R} fill="var(--color-panel)" stroke="var(--color-lagoon-600)" strokeWidth={3} />
        </g>
      ))}
    </g>
  );
});
