import { memo, useMemo } from "react";
import { describeSite, type DisplayConvention } from "@/lib/geometry";
import type { Grade } from "@/lib/domain/vocab";
import { GHOST_MARK, GRADE_ENCODING, SELECTION_RING } from "@/lib/map/encoding";
import { centreOf, pointOfSite, sectorOf, sectorPath } from "@/lib/map/geometry";

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

/** Hit target of a selectable ghost, around its label: at least 44 px on a tablet-sized map. */
const HIT_R = 22;

function GhostShapeInner({ ghost, conv, selected = false, onSelect }: { ghost: GhostLesion; conv: DisplayConvention; selected?: boolean; onSelect?: (id: string) => void }) {
  const { d, c, name } = useMemo(() => {
    const centre = centreOf(ghost);
    const status = ghost.statusWords ? ` (${ghost.statusWords})` : "";
    return {
      d: sectorPath(sectorOf(ghost, conv)) ?? "",
      c: pointOfSite(centre.storedH, centre.cm, conv),
      name: `Previous visit${ghost.trackLabel ? `, track ${ghost.trackLabel}` : ""}${status}: ${GRADE_ENCODING[ghost.grade].label}, ${describeSite(ghost.clockStartH, ghost.clockEndH, ghost.distanceStartCm, ghost.distanceEndCm, conv)}`,
    };
  }, [ghost, conv]);
  // Never editable. Selectable ghosts answer only on the circle around their label, so a tap
  // elsewhere inside the outline still draws a fresh lesion there.
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
      {interactive ? (
        <circle
          cx={c.x}
          cy={c.y}
          r={HIT_R}
          fill="transparent"
          stroke={selected ? SELECTION_RING.stroke : "none"}
          strokeWidth={2}
          pointerEvents="all"
          className="cursor-pointer"
          data-ghost-hit={ghost.id}
          onPointerDown={(e) => { e.stopPropagation(); select(); }}
        />
      ) : null}
      {ghost.trackLabel ? (
        <text x={c.x} y={c.y + 5} textAnchor="middle" fontSize={13} fontStyle="italic" fontWeight={selected ? 700 : 400} fill="var(--color-ink-soft)" stroke="var(--color-panel)" strokeWidth={3} paintOrder="stroke" pointerEvents="none" aria-hidden="true">
          {ghost.trackLabel}
        </text>
      ) : null}
    </g>
  );
}

export const GhostShape = memo(GhostShapeInner);
