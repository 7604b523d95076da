import { useId, useMemo, type KeyboardEvent, type PointerEvent, type ReactNode, type Ref, type SVGProps } from "react";
import { CARDINAL_DISPLAY_HOURS, anatomicalLabelAt, displayHour, toDisplayHours, type DisplayConvention } from "@/lib/geometry";
import { GHOST_MARK, ORIENTATION_NOTE } from "./encoding";
import { GhostShape, type GhostLesion } from "./ghost-shape";
import { LesionShape, type LesionSaveState, type MapLesion } from "./lesion-shape";
import { MapFace } from "./map-face";
import { VIEW_BOX } from "./map-geometry";
import { GradePatternDefs, safeId } from "./patterns";
import { TreatedRing, type TreatedArc } from "./treated-ring";

export const CONVENTION_LABEL: Record<DisplayConvention, string> = {
  lithotomy: "Lithotomy",
  prone_jackknife: "Prone jack-knife",
  left_lateral: "Left lateral",
};

export interface CanalMapProps {
  lesions: readonly MapLesion[];
  convention: DisplayConvention;
  selectedId?: string | null;
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
  /** Drawn above the lesions, in viewBox units (handles, the lesion being drawn). */
  overlay?: ReactNode;
  svgRef?: Ref<SVGSVGElement>;
  /** Pointer handlers and styles for the whole drawing (the editor's gestures). */
  svgProps?: Omit<SVGProps<SVGSVGElement>, "ref" | "viewBox" | "role">;
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
 */
export function CanalMap(props: CanalMapProps) {
  const { lesions, convention, selectedId, ghosts, selectedGhostId, treatedArcs, saveStates, focusable = true, overlay, svgRef, svgProps } = props;
  const prefix = safeId(useId());
  const desc = useMemo(() => orientationWords(convention), [convention]);
  const turnDeg = toDisplayHours(0, convention) * 30;
  return (
    <svg
      ref={svgRef}
      viewBox={VIEW_BOX}
      role="group"
      aria-labelledby={`${prefix}-title`}
      aria-describedby={`${prefix}-desc`}
      className="mx-auto block h-auto max-h-[calc(100vh-9rem)] w-full select-none"
      {...svgProps}
    >
      <title id={`${prefix}-title`}>{props.title ?? "Canal map"}</title>
      <desc id={`${prefix}-desc`}>{desc}</desc>
      <defs>
        <GradePatternDefs prefix={prefix} />
      </defs>
      <MapFace conv={convention} />
      {treatedArcs?.length ? <TreatedRing arcs={treatedArcs} conv={convention} /> : null}
      {ghosts?.length ? (
        <g opacity={GHOST_MARK.opacity}>
          {ghosts.map((g) => (
            <GhostShape key={g.id} ghost={g} conv={convention} selected={g.id === selectedGhostId} onSelect={props.onGhostSelect} />
          ))}
        </g>
      ) : null}
      {/* Order is kept stable on selection: moving a focused node in the DOM would drop keyboard focus. */}
      {/* Lesions are drawn in the stored frame and this layer turns them to the convention's
          numbering: switching conventions changes one transform, not two hundred paths. */}
      <g transform={turnDeg ? `rotate(${turnDeg})` : undefined}>
        {lesions.map((l) => (
          <LesionShape key={l.id} lesion={l} conv={convention} turnDeg={turnDeg} prefix={prefix} selected={l.id === selectedId} saveState={saveStates?.[l.id]} focusable={focusable} onPointerDown={props.onLesionPointerDown} onKeyDown={props.onLesionKeyDown} />
        ))}
      </g>
      {overlay}
    </svg>
  );
}
