import { memo, useMemo } from "react";
import { describeSite, type DisplayConvention } from "@/lib/geometry";
import type { Grade } from "@/lib/domain/vocab";
import { GHOST_MARK, GRADE_ENCODING } from "./encoding";
import { centreOf, pointOfSite, sectorOf, sectorPath } from "./map-geometry";

/** A lesion from an earlier visit, shown for follow-up: where to look again. */
export interface GhostLesion {
  id: string;
  trackLabel: string | null;
  grade: Grade;
  clockStartH: number;
  clockEndH: number;
  distanceStartCm: number;
  distanceEndCm: number;
}

function GhostShapeInner({ ghost, conv, onSelect }: { ghost: GhostLesion; conv: DisplayConvention; onSelect?: (id: string) => void }) {
  const { d, c, name } = useMemo(() => {
    const centre = centreOf(ghost);
    return {
      d: sectorPath(sectorOf(ghost, conv)) ?? "",
      c: pointOfSite(centre.storedH, centre.cm, conv),
      name: `Previous visit${ghost.trackLabel ? `, track ${ghost.trackLabel}` : ""}: ${GRADE_ENCODING[ghost.grade].label}, ${describeSite(ghost.clockStartH, ghost.clockEndH, ghost.distanceStartCm, ghost.distanceEndCm, conv)}`,
    };
  }, [ghost, conv]);
  // Not editable: the only thing a ghost does is get selected (to link it at follow-up).
  const interactive = Boolean(onSelect);
  return (
    <g
      role={interactive ? "button" : "img"}
      tabIndex={interactive ? 0 : undefined}
      aria-label={name}
      data-ghost-id={ghost.id}
      pointerEvents={interactive ? "all" : "none"}
      className="group outline-none"
      onPointerDown={interactive ? (e) => { e.stopPropagation(); onSelect!(ghost.id); } : undefined}
      onKeyDown={interactive ? (e) => { if (e.key === "Enter" || e.key === " ") { e.preventDefault(); onSelect!(ghost.id); } } : undefined}
    >
      <path d={d} fill="none" stroke={GRADE_ENCODING[ghost.grade].strokeHue} strokeWidth={GHOST_MARK.strokeWidth} strokeDasharray={GHOST_MARK.dash} className="group-focus-visible:stroke-[4px]" />
      {ghost.trackLabel ? (
        <text x={c.x} y={c.y + 5} textAnchor="middle" fontSize={13} fontStyle="italic" fill="var(--color-ink-soft)" pointerEvents="none" aria-hidden="true">
          {ghost.trackLabel}
        </text>
      ) : null}
    </g>
  );
}

export const GhostShape = memo(GhostShapeInner);
