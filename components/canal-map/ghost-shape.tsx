import { memo, useMemo } from "react";
import { describeSite, type DisplayConvention } from "@/lib/geometry";
import type { Grade } from "@/lib/domain/vocab";
import { GHOST_MARK, GRADE_ENCODING, SELECTION_RING } from "@/lib/map/encoding";
import { OUTER_RADIUS, polar, sectorOf, sectorPath } from "@/lib/map/geometry";

/** A lesion from an earlier visit, shown for follow-up: where to look again. */
export interface GhostLesion {
  id: string;
  trackLabel: string | null;
  grade: Grade;
  clockStartH: number;
  clockEndH: number;
  distanceStartCm: number;
  distanceEndCm: number;
  /** What was decided about it at this visit, in a word or two ("found", "not found"…). */
  statusWords?: string;
}

/**
 * The label of an earlier track is a tag just outside the outline's shallow edge, and the tag is
 * its whole tap target: the inside of the outline stays free for drawing the lesion found there
 * (a wider invisible target round the label took those taps). 32 viewBox units high: about 25 CSS
 * px on a tablet-sized map, above the 24 px minimum of WCAG 2.2 (2.5.8).
 */
const TAG_H = 32;
const TAG_GAP = 3;
/** Width of the tag for a label: the text at about 8 units a character, and room round it. */
export const tagWidth = (label: string) => Math.max(36, label.length * 8 + 16);

/** Where the tag sits: centred on the outline's middle angle, clear of its shallow edge. */
export function ghostTag(ghost: GhostLesion, conv: DisplayConvention) {
  const g = sectorOf(ghost, conv);
  const label = ghost.trackLabel ?? "";
  const w = tagWidth(label);
  const midA = (g.startAngle + g.endAngle) / 2;
  // Far enough out that no corner of the tag reaches back over the edge, whatever the angle; on
  // the outermost skin, where that would leave the drawing, inside the deep edge instead.
  const clear = TAG_GAP + Math.hypot(w, TAG_H) / 2;
  const r = g.outerRadius + clear + TAG_H <= OUTER_RADIUS + 40 ? g.outerRadius + clear : Math.max(0, g.innerRadius - clear);
  const c = polar(midA, r);
  return { x: c.x - w / 2, y: c.y - TAG_H / 2, width: w, height: TAG_H, cx: c.x, cy: c.y };
}

function GhostShapeInner({ ghost, conv, selected = false, onSelect }: { ghost: GhostLesion; conv: DisplayConvention; selected?: boolean; onSelect?: (id: string) => void }) {
  const { d, tag, name } = useMemo(() => {
    const status = ghost.statusWords ? ` (${ghost.statusWords})` : "";
    return {
      d: sectorPath(sectorOf(ghost, conv)) ?? "",
      tag: ghostTag(ghost, conv),
      name: `Previous visit${ghost.trackLabel ? `, track ${ghost.trackLabel}` : ""}${status}: ${GRADE_ENCODING[ghost.grade].label}, ${describeSite(ghost.clockStartH, ghost.clockEndH, ghost.distanceStartCm, ghost.distanceEndCm, conv)}`,
    };
  }, [ghost, conv]);
  // Never editable. Selectable ghosts answer only on their label's tag, so a tap anywhere inside
  // the outline still draws a fresh lesion there.
  const interactive = Boolean(onSelect);
  const select = () => onSelect?.(ghost.id);
  return (
    <g
      role={interactive ? "button" : "img"}
      tabIndex={interactive ? 0 : undefined}
      aria-label={name}
      aria-pressed={interactive ? selected : undefined}
      data-ghost-id={ghost.id}
      data-ghost-label={ghost.trackLabel ?? undefined}
      pointerEvents="none"
      className="group outline-none"
      onKeyDown={interactive ? (e) => { if (e.key === "Enter" || e.key === " ") { e.preventDefault(); e.stopPropagation(); select(); } } : undefined}
    >
      {selected ? <path d={d} fill="none" stroke={SELECTION_RING.stroke} strokeWidth={SELECTION_RING.width} strokeDasharray={GHOST_MARK.dash} /> : null}
      <path d={d} fill="none" stroke={GRADE_ENCODING[ghost.grade].strokeHue} strokeWidth={GHOST_MARK.strokeWidth} strokeDasharray={GHOST_MARK.dash} className="group-focus-visible:stroke-[4px]" />
      {ghost.trackLabel ? (
        <g data-ghost-tag={ghost.id}>
          <rect
            x={tag.x}
            y={tag.y}
            width={tag.width}
            height={tag.height}
            rx={6}
            fill="var(--color-panel)"
            stroke={selected ? SELECTION_RING.stroke : GRADE_ENCODING[ghost.grade].strokeHue}
            strokeWidth={selected ? 2.5 : 1.5}
            strokeDasharray={GHOST_MARK.dash}
            pointerEvents={interactive ? "all" : "none"}
            className={interactive ? "cursor-pointer" : undefined}
            data-ghost-hit={interactive ? ghost.id : undefined}
            onPointerDown={interactive ? (e) => { e.stopPropagation(); select(); } : undefined}
          />
          <text x={tag.cx} y={tag.cy + 5} textAnchor="middle" fontSize={13} fontStyle="italic" fontWeight={selected ? 700 : 400} fill="var(--color-ink-soft)" pointerEvents="none" aria-hidden="true">
            {ghost.trackLabel}
          </text>
        </g>
      ) : null}
    </g>
  );
}

export const GhostShape = memo(GhostShapeInner);
