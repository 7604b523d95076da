import { memo, useMemo, type KeyboardEvent, type PointerEvent } from "react";
import { describeSite, type DisplayConvention } from "@/lib/geometry";
import type { LesionDto } from "@/lib/validation/lesions";
import { BIOPSY_TAG, GRADE_ENCODING, SELECTION_RING, TREATED_MARK, UNSAVED_MARK } from "./encoding";
import { centreOf, isPointLesion, pointOfSite, polar, radiusOfCm, sectorOf, sectorPath } from "./map-geometry";
import { patternId } from "./patterns";

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

interface Props {
  lesion: MapLesion;
  conv: DisplayConvention;
  /** How far CanalMap turns the lesion layer for this convention, in degrees clockwise. */
  turnDeg: number;
  prefix: string;
  selected: boolean;
  saveState?: LesionSaveState;
  focusable: boolean;
  onPointerDown?: (id: string, e: PointerEvent<SVGGElement>) => void;
  onKeyDown?: (id: string, e: KeyboardEvent<SVGGElement>) => void;
}

/** The frame lesions are drawn in before the layer is turned: lithotomy numbering is the stored one. */
const STORED_FRAME: DisplayConvention = "lithotomy";

function LesionShapeInner({ lesion, conv, turnDeg, prefix, selected, saveState, focusable, onPointerDown, onKeyDown }: Props) {
  // Geometry is drawn in the stored frame (lithotomy numbering: display offset 0) and the
  // whole lesion layer is turned by the convention (CanalMap), so a change of numbering leaves
  // every path as it is: only the spoken names change, and the labels turn back upright.
  // Only what is drawn is computed: the halo path when treated, the ring when selected.
  const shape = useMemo(() => {
    const point = isPointLesion(lesion);
    const centre = centreOf(lesion);
    const c = pointOfSite(centre.storedH, centre.cm, STORED_FRAME);
    const geo = sectorOf(lesion, STORED_FRAME);
    const body = point ? null : sectorPath(geo) ?? "";
    const halo = point || !lesion.treated ? null : sectorPath(sectorOf(lesion, STORED_FRAME, TREATED_MARK.haloPx)) ?? "";
    const mid = (geo.startAngle + geo.endAngle) / 2;
    const outerEdge = point ? { x: c.x, y: c.y - POINT_RADIUS - 8 } : polar(mid, geo.outerRadius + TREATED_MARK.haloPx + 8);
    const innerEdge = point ? { x: c.x + POINT_RADIUS + 12, y: c.y } : polar(mid, Math.max(geo.innerRadius - 14, radiusOfCm(8)));
    return { point, c, body, halo, outerEdge, innerEdge };
  }, [lesion]);
  const name = useMemo(() => lesionAccessibleName(lesion, conv), [lesion, conv]);
  /** Undoes the layer's turn around a point, so text reads upright in every convention. */
  const upright = (p: { x: number; y: number }) => (turnDeg ? `rotate(${-turnDeg} ${p.x} ${p.y})` : undefined);

  const tagText = lesion.biopsyLabels.join("");
  const tagWidth = Math.max(BIOPSY_TAG.size, 8 + tagText.length * 10);

  return (
    <>
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
      <ShapeBody lesion={lesion} shape={shape} prefix={prefix} selected={selected} saveState={saveState} />
    </g>
    {/* Visible marks sit outside the button, so its spoken name is the whole of its label. */}
    <g aria-hidden="true" pointerEvents="none" transform={shape.point ? upright(shape.c) : undefined}>
      {lesion.treated ? (
        <g aria-hidden="true" pointerEvents="none">
          <circle cx={shape.outerEdge.x} cy={shape.outerEdge.y} r={TREATED_MARK.markRadius} fill="var(--color-panel)" stroke="var(--color-ink)" strokeWidth={2} />
          <circle cx={shape.outerEdge.x} cy={shape.outerEdge.y} r={2.2} fill="var(--color-ink)" />
        </g>
      ) : null}
      {tagText ? (
        <g aria-hidden="true" pointerEvents="none" transform={shape.point ? undefined : upright(shape.innerEdge)}>
          <rect x={shape.innerEdge.x - tagWidth / 2} y={shape.innerEdge.y - BIOPSY_TAG.size / 2} width={tagWidth} height={BIOPSY_TAG.size} fill="var(--color-panel)" stroke="var(--color-ink)" strokeWidth={1.5} />
          <text x={shape.innerEdge.x} y={shape.innerEdge.y + 5} textAnchor="middle" fontSize={13} fontWeight={700} fill="var(--color-ink)">{tagText}</text>
        </g>
      ) : null}
      {/* The turn sits on a wrapping group: changing a <text>'s own transform makes Chromium lay
          the text out again (~18 ms for 200 labels), changing its parent's does not (~3 ms). */}
      <g transform={shape.point ? undefined : upright(shape.c)}>
        <LesionLabel label={lesion.label} x={shape.c.x} y={shape.point ? shape.c.y - POINT_RADIUS - 6 : shape.c.y + 5} failed={saveState === "failed"} />
      </g>
    </g>
    </>
  );
}

type ShapeGeometry = { point: boolean; c: { x: number; y: number }; body: string | null; halo: string | null };

/**
 * What is drawn inside the lesion's button: hit area, treated halo, the graded body, focus and
 * selection rings. Memoised without the convention: a change of numbering does not touch it.
 */
const ShapeBody = memo(function ShapeBody({ lesion, shape, prefix, selected, saveState }: { lesion: MapLesion; shape: ShapeGeometry; prefix: string; selected: boolean; saveState?: LesionSaveState }) {
  const enc = GRADE_ENCODING[lesion.grade];
  const ring = useMemo(
    () => (selected && !shape.point ? sectorPath(sectorOf(lesion, STORED_FRAME, SELECTION_RING.padPx + (lesion.treated ? TREATED_MARK.haloPx : 0))) ?? "" : null),
    [selected, shape.point, lesion],
  );
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
      {selected ? (
        shape.point ? (
          <circle cx={shape.c.x} cy={shape.c.y} r={POINT_RADIUS + 4} fill="none" stroke={SELECTION_RING.stroke} strokeWidth={SELECTION_RING.width} />
        ) : (
          <path d={ring!} fill="none" stroke={SELECTION_RING.stroke} strokeWidth={SELECTION_RING.width} />
        )
      ) : null}
    </>
  );
});

/** The lesion's visible label (its spoken name is on the button). */
const LesionLabel = memo(function LesionLabel({ label, x, y, failed }: { label: string; x: number; y: number; failed: boolean }) {
  return (
    <text x={x} y={y} textAnchor="middle" fontSize={14} fontWeight={700} fill="var(--color-ink)" stroke="var(--color-panel)" strokeWidth={4} paintOrder="stroke" pointerEvents="none" aria-hidden="true">
      {label}
      {failed ? " !" : ""}
    </text>
  );
});

/** One lesion; memoised so a tap or drag re-renders only the lesions that changed. */
export const LesionShape = memo(LesionShapeInner);
