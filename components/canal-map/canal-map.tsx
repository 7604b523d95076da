import { memo, useId, useMemo, type KeyboardEvent, type PointerEvent, type ReactNode, type Ref, type HTMLAttributes } from "react";
import { CARDINAL_DISPLAY_HOURS, anatomicalLabelAt, displayHour, toDisplayHours, type DisplayConvention } from "@/lib/geometry";
import { useAfterPaint } from "./after-paint";
import { GHOST_MARK, ORIENTATION_NOTE } from "@/lib/map/encoding";
import { GhostShape, type GhostLesion } from "./ghost-shape";
import { LesionBody, LesionMarks, SelectionRing, type LesionSaveState, type MapLesion } from "./lesion-shape";
import { MapFace, RingLabels } from "./map-face";
import { VIEW_BOX } from "@/lib/map/geometry";
import { GradePatternDefs, safeId } from "./patterns";
import { useSelectionFromProp, type SelectionStore } from "./selection";
import { TreatedRing, type TreatedArc } from "./treated-ring";

export const CONVENTION_LABEL: Record<DisplayConvention, string> = {
  lithotomy: "Lithotomy",
  prone_jackknife: "Prone jack-knife",
  left_lateral: "Left lateral",
};

/** Every angle a convention turns the lesion layer by (0° and 180°): one marks layer each. */
const MARK_TURNS = [...new Set((Object.keys(CONVENTION_LABEL) as DisplayConvention[]).map((c) => toDisplayHours(0, c) * 30))].sort((a, b) => a - b);

export interface CanalMapProps {
  lesions: readonly MapLesion[];
  convention: DisplayConvention;
  selectedId?: string | null;
  /** Selection held outside React state (the editor): when given, selectedId is ignored and a
   *  change of selection re-renders only the two lesions concerned, not the map. */
  selection?: SelectionStore;
  /** Previous visit's lesions, drawn faint and dashed for follow-up. */
  ghosts?: readonly GhostLesion[];
  onGhostSelect?: (id: string) => void;
  selectedGhostId?: string | null;
  /** This visit's treated arcs (stored hours), drawn as a band just outside the verge. */
  treatedArcs?: readonly TreatedArc[];
  saveStates?: Readonly<Record<string, LesionSaveState | undefined>>;
  /** Lesions are keyboard-focusable (true on every screen that lets you select). */
  focusable?: boolean;
  onLesionPointerDown?: (id: string, e: PointerEvent<SVGGElement>) => void;
  onLesionKeyDown?: (id: string, e: KeyboardEvent<SVGGElement>) => void;
  /** Drawn above the lesions and their labels, in viewBox units and display coordinates (handles). */
  overlay?: ReactNode;
  svgRef?: Ref<SVGSVGElement>;
  /** Pointer handlers, styles and states for the whole drawing (the editor's gestures). */
  surfaceProps?: Omit<HTMLAttributes<HTMLDivElement>, "role">;
  title?: string;
}

/** Words for screen readers: how the face is turned in this convention. */
export function orientationWords(conv: DisplayConvention): string {
  const where = CARDINAL_DISPLAY_HOURS.map((d) => `${displayHour(d)} o'clock ${anatomicalLabelAt(d, conv)}`).join(", ");
  return `${CONVENTION_LABEL[conv]} numbering: ${where}. ${ORIENTATION_NOTE}`;
}

/**
 * The canal map: a pure SVG drawing that scales to its container. It draws; it does not
 * decide. Selection, gestures and saving belong to the screen that uses it.
 *
 * Stacked SVGs with one viewBox, so the browser can keep each as its own layer:
 *   1. the face (zones, rings, numbers, labels), the treated band and earlier outlines;
 *   2. the lesions, drawn in the stored frame and turned as a whole by the numbering (a CSS
 *      turn the compositor applies: switching conventions repaints nothing on this layer);
 *   3. the marks, upright in display coordinates: labels, biopsy tags, treated marks. The
 *      conventions turn the face by only two angles (0° and 180°), so there is one marks layer
 *      per angle, both drawn, the other one transparent: a change of numbering shows the other
 *      (the compositor again) instead of moving 200 labels;
 *   4. the selection ring and the owner's overlay (handles): a tap changes only this layer.
 * Pointer events fall through the upper layers except on lesions, handles and other marks that ask
 * for them; gestures are handled on the wrapper, and `svgRef` (the face) gives coordinates.
 */
export function CanalMap(props: CanalMapProps) {
  const { lesions, convention, selectedId, ghosts, selectedGhostId, treatedArcs, saveStates, focusable = true, overlay, svgRef, surfaceProps } = props;
  const prefix = safeId(useId());
  const fromProp = useSelectionFromProp(selectedId);
  const selection = props.selection ?? fromProp;
  const desc = useMemo(() => orientationWords(convention), [convention]);
  const turnDeg = toDisplayHours(0, convention) * 30;
  // The spoken names follow a change of numbering a frame after the drawing does.
  const namesConv = useAfterPaint(convention);
  const layer = "pointer-events-none absolute inset-0 h-full w-full [will-change:transform]";
  // Kept painted while transparent (will-change: opacity), so showing one is the compositor's job.
  const marksLayer = "pointer-events-none absolute inset-0 h-full w-full [will-change:transform,opacity]";
  return (
    <div
      role="group"
      aria-labelledby={`${prefix}-title`}
      aria-describedby={`${prefix}-desc`}
      data-canal-map=""
      {...surfaceProps}
      className={`relative mx-auto select-none ${surfaceProps?.className ?? ""}`}
    >
      <svg ref={svgRef} viewBox={VIEW_BOX} className="block h-auto max-h-[calc(100vh-9rem)] w-full">
        <title id={`${prefix}-title`}>{props.title ?? "Canal map"}</title>
        <desc id={`${prefix}-desc`}>{desc}</desc>
        <MapFace conv={convention} />
        {treatedArcs?.length ? <TreatedRing arcs={treatedArcs} conv={convention} /> : null}
        {ghosts?.length ? (
          <g opacity={GHOST_MARK.opacity}>
            {ghosts.map((g) => (
              <GhostShape key={g.id} ghost={g} conv={convention} selected={g.id === selectedGhostId} onSelect={props.onGhostSelect} />
            ))}
          </g>
        ) : null}
      </svg>
      <svg viewBox={VIEW_BOX} className={layer} style={turnDeg ? { transform: `rotate(${turnDeg}deg)` } : undefined} data-layer="lesions">
        <defs>
          <GradePatternDefs prefix={prefix} />
        </defs>
        <LesionBodies lesions={lesions} conv={namesConv} prefix={prefix} selection={selection} saveStates={saveStates} focusable={focusable} onPointerDown={props.onLesionPointerDown} onKeyDown={props.onLesionKeyDown} />
      </svg>
      {MARK_TURNS.map((turn) => (
        <svg key={turn} viewBox={VIEW_BOX} className={marksLayer} style={{ opacity: turn === turnDeg ? 1 : 0 }} aria-hidden="true" data-layer="marks" data-turn={turn} data-shown={turn === turnDeg || undefined}>
          <LesionMarksLayer lesions={lesions} turnDeg={turn} saveStates={saveStates} />
        </svg>
      ))}
      <svg viewBox={VIEW_BOX} className={layer} aria-hidden="true" data-layer="selection">
        <RingLabels />
        <SelectionRing selection={selection} lesions={lesions} conv={convention} />
        {overlay}
      </svg>
    </div>
  );
}

interface LesionBodiesProps {
  lesions: readonly MapLesion[];
  conv: DisplayConvention;
  prefix: string;
  selection: SelectionStore;
  saveStates?: Readonly<Record<string, LesionSaveState | undefined>>;
  focusable: boolean;
  onPointerDown?: (id: string, e: PointerEvent<SVGGElement>) => void;
  onKeyDown?: (id: string, e: KeyboardEvent<SVGGElement>) => void;
}

/**
 * The lesions' bodies. Memoised, and selection reaches each through the store, so a tap does
 * not render this list again. Order is kept stable on selection: moving a focused node in the
 * DOM would drop keyboard focus.
 */
const LesionBodies = memo(function LesionBodies({ lesions, conv, prefix, selection, saveStates, focusable, onPointerDown, onKeyDown }: LesionBodiesProps) {
  return (
    <>
      {lesions.map((l) => (
        <LesionBody key={l.id} lesion={l} conv={conv} prefix={prefix} selection={selection} saveState={saveStates?.[l.id]} focusable={focusable} onPointerDown={onPointerDown} onKeyDown={onKeyDown} />
      ))}
    </>
  );
});

/** Every lesion's label and tags, upright, where the turned lesion layer draws its body. */
const LesionMarksLayer = memo(function LesionMarksLayer({ lesions, turnDeg, saveStates }: { lesions: readonly MapLesion[]; turnDeg: number; saveStates?: Readonly<Record<string, LesionSaveState | undefined>> }) {
  return (
    <>
      {lesions.map((l) => (
        <LesionMarks key={l.id} lesion={l} turnDeg={turnDeg} saveState={saveStates?.[l.id]} />
      ))}
    </>
  );
});
