import { memo, useMemo } from "react";
import { arcLengthH, arcToRadians, isFullCircle, formatClock, toDisplayHours, unionArcs, type Arc, type DisplayConvention } from "@/lib/geometry";
import { TREATED_RING } from "@/lib/map/encoding";
import { polar, radiusOfCm, sectorPath } from "@/lib/map/geometry";

/** A treated arc as stored (lithotomy hours), as the treatments route returns it. */
export type TreatedArc = { startH: number; endH: number };

const INNER_R = radiusOfCm(0) + TREATED_RING.innerGapPx;
const OUTER_R = INNER_R + TREATED_RING.widthPx;
const MID_R = (INNER_R + OUTER_R) / 2;

/** An SVG arc at radius r between two angles (clockwise from the top); a full turn is drawn as two halves. */
function circleArc(startAngle: number, endAngle: number, r: number): string {
  if (endAngle - startAngle >= 2 * Math.PI - 1e-6) {
    const a = polar(startAngle, r);
    const b = polar(startAngle + Math.PI, r);
    return `M${a.x},${a.y}A${r},${r} 0 1 1 ${b.x},${b.y}A${r},${r} 0 1 1 ${a.x},${a.y}`;
  }
  const a = polar(startAngle, r);
  const b = polar(endAngle, r);
  const large = endAngle - startAngle > Math.PI ? 1 : 0;
  return `M${a.x},${a.y}A${r},${r} 0 ${large} 1 ${b.x},${b.y}`;
}

/**
 * The visit's treated arcs as one band just outside the verge: overlapping arcs are merged
 * first (the same union the server measures), so a doubly treated hour is not drawn twice.
 */
function TreatedRingInner({ arcs, conv }: { arcs: readonly TreatedArc[]; conv: DisplayConvention }) {
  const pieces = useMemo(
    () =>
      unionArcs(arcs as readonly Arc[]).map((u, i) => {
        const startD = toDisplayHours(u.startH, conv);
        const length = arcLengthH(u);
        const { startAngle, endAngle } = arcToRadians({ startH: startD, endH: startD + length });
        return {
          key: `${i}-${u.startH}-${u.endH}`,
          outline: sectorPath({ innerRadius: INNER_R, outerRadius: OUTER_R, startAngle, endAngle }) ?? "",
          rungs: circleArc(startAngle, endAngle, MID_R),
          words: isFullCircle(u) ? "the whole circumference" : `${formatClock(startD)} to ${formatClock(toDisplayHours(u.endH, conv))}`,
        };
      }),
    [arcs, conv],
  );
  if (!pieces.length) return null;
  return (
    <g role="img" aria-label={`Treated this visit: ${pieces.map((p) => p.words).join("; ")}`} pointerEvents="none" data-treated-ring="">
      {pieces.map((p) => (
        <g key={p.key}>
          <path d={p.outline} fill="var(--color-panel)" fillOpacity={0.85} stroke={TREATED_RING.stroke} strokeWidth={TREATED_RING.rail} />
          <path d={p.rungs} fill="none" stroke={TREATED_RING.stroke} strokeWidth={TREATED_RING.widthPx - 2} strokeDasharray={TREATED_RING.rung} />
        </g>
      ))}
    </g>
  );
}

export const TreatedRing = memo(TreatedRingInner);
