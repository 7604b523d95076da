import { memo, useMemo, type KeyboardEvent, type PointerEvent } from "react";
import { describeSite, type DisplayConvention } from "@/lib/geometry";
import type { LesionDto } from "@/lib/validation/lesions";
import { BIOPSY_TAG, GRADE_ENCODING, SELECTION_RING, TREATED_MARK, UNSAVED_MARK } from "@/lib/map/encoding";
import { angleOf, centreOf, isPointLesion, pointOfSite, polar, radiusOfCm, sectorOf, sectorPath } from "@/lib/map/geometry";
import { patternId } from "./patterns";
import { useIsSelected, useSelectedLesion, type SelectionStore } from "./selection";

/** What the map needs of a lesion; LesionDto satisfies it. */
export type MapLesion = Pick<
  LesionDto,
  "id" | "label" | "grade" | "clockStartH" | "clockEndH" | "distanceStartCm" | "distanceEndCm" | "treated" | "biopsyLabels"
>;

export type LesionSaveState = "saving" | "failed";

/** The screen-reader name of a lesion, e.g. "L2: HSIL, 1 to 3 o'clock (…), 1–2 cm from the verge". */
export function lesionAccessibleName(l: MapLesion, conv: DisplayConvention): string {
  const parts = [`${l.label}: ${GRADE_ENCODING[l.grade].label}, ${describeSite(l.clockStartH, l.clockEndH, l.distanceStartCm, l.distanceEndCm, conv)}`];
  if (l.treated) parts.push("treated");
  if (l.biopsyLabels.length) parts.push(`biopsy ${l.biopsyLabels.join(", ")}`);
  return parts.join(", ");
}

const POINT_RADIUS = 9;
/** Invisible stroke around each shape: the hit target stays ≥ 44 px on a tablet. */
const HIT_STROKE = 30;
/** The keyboard-focus stroke along the outline: half of it falls outside the shape. */
const FOCUS_STROKE = 9;

/** The frame lesions are drawn in before the layer is turned: lithotomy numbering is the stored one. */
const STORED_FRAME: DisplayConvention = "lithotomy";

/** The body's outlines (the path strings, the costly part), for the lesion layer only. */
function useShapeGeometry(lesion: MapLesion): ShapeGeometry {
  return useMemo(() => {
    const point = isPointLesion(lesion);
    const centre = centreOf(lesion);
    const c = pointOfSite(centre.storedH, centre.cm, STORED_FRAME);
    const geo = sectorOf(lesion, STORED_FRAME);
    const body = point ? null : sectorPath(geo) ?? "";
    const halo = point || !lesion.treated ? null : sectorPath(sectorOf(lesion, STORED_FRAME, TREATED_MARK.haloPx)) ?? "";
    return { point, c, body, halo };
  }, [lesion]);
}

/**
 * Where the marks sit, as angle and radius in the stored frame (no path strings): a marks layer
 * adds its turn to the angle, since the lesion layer is turned about the same centre.
 */
function useMarkAnchors(lesion: MapLesion) {
  return useMemo(() => {
    const point = isPointLesion(lesion);
    const centre = centreOf(lesion);
    const geo = sectorOf(lesion, STORED_FRAME);
    const mid = (geo.startAngle + geo.endAngle) / 2;
    return {
      point,
      c: { angle: angleOf(centre.storedH, STORED_FRAME), r: radiusOfCm(centre.cm) },
      outerEdge: { angle: mid, r: geo.outerRadius + TREATED_MARK.haloPx + 8 },
      innerEdge: { angle: mid, r: Math.max(geo.innerRadius - 14, radiusOfCm(8)) },
    };
  }, [lesion]);
}

interface BodyProps {
  lesion: MapLesion;
  /** The numbering the spoken name uses; the drawing itself is in the stored frame. */
  conv: DisplayConvention;
  prefix: string;
  /** The map's selection; the shape re-renders only when it gains or loses it. */
  selection: SelectionStore;
  saveState?: LesionSaveState;
  focusable: boolean;
  onPointerDown?: (id: string, e: PointerEvent<SVGGElement>) => void;
  onKeyDown?: (id: string, e: KeyboardEvent<SVGGElement>) => void;
}

/**
 * A lesion's graded body: the button that is tapped, focused and spoken. Drawn in the stored
 * frame, on the lesion layer that CanalMap turns as a whole, so a change of numbering redraws
 * nothing here: only the spoken name changes.
 */
function LesionBodyInner({ lesion, conv, prefix, selection, saveState, focusable, onPointerDown, onKeyDown }: BodyProps) {
  const selected = useIsSelected(selection, lesion.id);
  const shape = useShapeGeometry(lesion);
  const name = useMemo(() => lesionAccessibleName(lesion, conv), [lesion, conv]);
  return (
    <g
      role="button"
      tabIndex={focusable ? 0 : -1}
      aria-label={name + (saveState === "failed" ? ", not saved" : "")}
      aria-pressed={selected}
      data-lesion-id={lesion.id}
      className="group cursor-pointer outline-none"
      opacity={saveState === "saving" ? 0.75 : 1}
      onPointerDown={onPointerDown ? (e) => onPointerDown(lesion.id, e) : undefined}
      onKeyDown={onKeyDown ? (e) => onKeyDown(lesion.id, e) : undefined}
    >
      <ShapeBody lesion={lesion} shape={shape} prefix={prefix} saveState={saveState} />
    </g>
  );
}

/**
 * A lesion's visible marks: label, biopsy tag, treated mark. They sit outside the button (its
 * spoken name is the whole of its label), on a layer that is not turned, placed where the
 * turned body is: text always reads upright. Each sits in a translated group, so a change of
 * numbering moves groups and never lays text out again (moving a <text> itself costs Chromium
 * a text layout each, ~18 ms for 200 labels; moving its parent ~3 ms).
 */
function LesionMarksInner({ lesion, turnDeg, saveState }: { lesion: MapLesion; turnDeg: number; saveState?: LesionSaveState }) {
  const shape = useMarkAnchors(lesion);
  const turn = (turnDeg * Math.PI) / 180;
  const at = ({ angle, r }: { angle: number; r: number }) => polar(angle + turn, r);
  const c = at(shape.c);
  const outer = shape.point ? { x: c.x, y: c.y - POINT_RADIUS - 8 } : at(shape.outerEdge);
  const inner = shape.point ? { x: c.x + POINT_RADIUS + 12, y: c.y } : at(shape.innerEdge);
  const labelAt = shape.point ? { x: c.x, y: c.y - POINT_RADIUS - 6 } : { x: c.x, y: c.y + 5 };
  const tagText = lesion.biopsyLabels.join("");
  return (
    <g aria-hidden="true" pointerEvents="none" data-marks-of={lesion.id}>
      {lesion.treated ? (
        <g transform={`translate(${outer.x} ${outer.y})`}>
          <circle r={TREATED_MARK.markRadius} fill="var(--color-panel)" stroke="var(--color-ink)" strokeWidth={2} />
          <circle r={2.2} fill="var(--color-ink)" />
        </g>
      ) : null}
      {tagText ? (
        <g transform={`translate(${inner.x} ${inner.y})`}>
          <BiopsyTag text={tagText} />
        </g>
      ) : null}
      <g transform={`translate(${labelAt.x} ${labelAt.y})`}>
        <LesionLabel label={lesion.label} failed={saveState === "failed"} />
      </g>
    </g>
  );
}

type ShapeGeometry = { point: boolean; c: { x: number; y: number }; body: string | null; halo: string | null };

/**
 * What is drawn inside the lesion's button: hit area, treated halo, the graded body, the focus
 * ring. Memoised without the convention and the selection (the ring of the selected lesion is
 * drawn by CanalMap on the selection layer): neither a tap nor a change of numbering touches it.
 */
const ShapeBody = memo(function ShapeBody({ lesion, shape, prefix, saveState }: { lesion: MapLesion; shape: ShapeGeometry; prefix: string; saveState?: LesionSaveState }) {
  const enc = GRADE_ENCODING[lesion.grade];
  const fill = `url(#${patternId(prefix, lesion.grade)})`;
  const outline = saveState === "failed" ? UNSAVED_MARK.stroke : enc.strokeHue;
  const drawBody = (extra: Record<string, unknown>) =>
    shape.point ? <circle cx={shape.c.x} cy={shape.c.y} r={POINT_RADIUS} {...extra} /> : <path d={shape.body!} {...extra} />;
  return (
    <>
      {drawBody({ fill: "none", stroke: "transparent", strokeWidth: HIT_STROKE, pointerEvents: "all" })}
      {lesion.treated && !shape.point ? (
        <path d={shape.halo!} fill="none" stroke="var(--color-ink)" strokeWidth={TREATED_MARK.strokeWidth} strokeDasharray={TREATED_MARK.dash} />
      ) : null}
      {drawBody({ fill, stroke: outline, strokeWidth: saveState === "failed" ? UNSAVED_MARK.width : enc.outlineWidth, strokeDasharray: saveState === "failed" ? UNSAVED_MARK.dash : enc.outlineDash, strokeLinecap: "round", strokeLinejoin: "round" })}
      {enc.doubleOutline ? drawBody({ fill: "none", stroke: "var(--color-paper)", strokeWidth: 2 }) : null}
      {/* Focus ring, drawn by us because outlines on SVG groups are unreliable across browsers:
          a wide dashed stroke along the shape's own outline, shown for keyboard focus only
          (focus-visible). No state and no extra geometry: a tap that moves focus redraws nothing.
    Hidden with display:none, not opacity 0: a transparent element still costs Chromium a
    paint chunk of its own, 200 of them on every frame. */}
      {shape.point ? (
        <circle cx={shape.c.x} cy={shape.c.y} r={POINT_RADIUS + 7} fill="none" stroke="var(--color-lagoon-900)" strokeWidth={3} strokeDasharray="4 3" className="hidden group-focus-visible:inline" />
      ) : (
        drawBody({ fill: "none", stroke: "var(--color-lagoon-900)", strokeWidth: FOCUS_STROKE, strokeDasharray: "6 4", className: "hidden group-focus-visible:inline" })
      )}
    </>
  );
});

/** The lesion's visible label (its spoken name is on the button), centred on its group's origin. */
const LesionLabel = memo(function LesionLabel({ label, failed }: { label: string; failed: boolean }) {
  return (
    <text textAnchor="middle" fontSize={14} fontWeight={700} fill="var(--color-ink)" stroke="var(--color-panel)" strokeWidth={4} paintOrder="stroke">
      {label}
      {failed ? " !" : ""}
    </text>
  );
});

/** A biopsy's specimen letters in a square tag, centred on its group's origin. */
const BiopsyTag = memo(function BiopsyTag({ text }: { text: string }) {
  const width = Math.max(BIOPSY_TAG.size, 8 + text.length * 10);
  return (
    <>
      <rect x={-width / 2} y={-BIOPSY_TAG.size / 2} width={width} height={BIOPSY_TAG.size} fill="var(--color-panel)" stroke="var(--color-ink)" strokeWidth={1.5} />
      <text y={5} textAnchor="middle" fontSize={13} fontWeight={700} fill="var(--color-ink)">{text}</text>
    </>
  );
});

/** Memoised, so a tap, a drag or a save re-renders only the lesions it concerns. */
export const LesionBody = memo(LesionBodyInner);
export const LesionMarks = memo(LesionMarksInner);

/**
 * The selected lesion's ring, in display coordinates on the marks layer: a tap changes this
 * small group and nothing on the lesion layer, which the browser then need not paint again.
 */
export function SelectionRing({ selection, lesions, conv }: { selection: SelectionStore; lesions: readonly MapLesion[]; conv: DisplayConvention }) {
  const lesion = useSelectedLesion(selection, lesions);
  if (!lesion) return null;
  if (isPointLesion(lesion)) {
    const centre = centreOf(lesion);
    const c = pointOfSite(centre.storedH, centre.cm, conv);
    return <circle cx={c.x} cy={c.y} r={POINT_RADIUS + 4} fill="none" stroke={SELECTION_RING.stroke} strokeWidth={SELECTION_RING.width} pointerEvents="none" data-selection-ring={lesion.id} />;
  }
  const d = sectorPath(sectorOf(lesion, conv, SELECTION_RING.padPx + (lesion.treated ? TREATED_MARK.haloPx : 0))) ?? "";
  return <path d={d} fill="none" stroke={SELECTION_RING.stroke} strokeWidth={SELECTION_RING.width} pointerEvents="none" data-selection-ring={lesion.id} />;
}
