import { memo } from "react";
import { CARDINAL_DISPLAY_HOURS, anatomicalLabelAt, displayHour, fromDisplayHours, zoneBands, type DisplayConvention } from "@/lib/geometry";
import { ZONE_ENCODING, DENTATE_RING, VERGE_RING } from "@/lib/map/encoding";
import { LABEL_RADIUS, NUMBER_RADIUS, OUTER_RADIUS, polar, radiusOfCm, sectorPath } from "@/lib/map/geometry";

const FULL = 2 * Math.PI;
const BANDS = zoneBands().map((b) => ({
  ...b,
  fill: ZONE_ENCODING.find((z) => z.zone === b.zone)!.fill,
  d: sectorPath({ innerRadius: radiusOfCm(b.toCm), outerRadius: radiusOfCm(b.fromCm), startAngle: 0, endAngle: FULL }) ?? "",
}));
const VERGE_R = radiusOfCm(0);
const DENTATE_R = radiusOfCm(1.5);
const INNER_R = radiusOfCm(8);
const TICKS = Array.from({ length: 24 }, (_, i) => i / 2);

/**
 * The face of the clock: zone bands, rings, ticks, numbers and anatomical labels in the
 * active convention. Depends on the convention only, so it is drawn once per convention.
 */
function MapFaceInner({ conv }: { conv: DisplayConvention }) {
  return (
    <g aria-hidden="true" pointerEvents="none">
      {BANDS.map((b) => (
        <path key={b.zone} d={b.d} fill={b.fill} />
      ))}
      {TICKS.filter((h) => Number.isInteger(h)).map((h) => {
        const a = (h * Math.PI) / 6;
        const p0 = polar(a, INNER_R);
        const p1 = polar(a, OUTER_RADIUS);
        return <line key={`spoke-${h}`} x1={p0.x} y1={p0.y} x2={p1.x} y2={p1.y} stroke="var(--color-rule-strong)" strokeWidth={h % 3 === 0 ? 1.2 : 0.7} strokeOpacity={0.7} />;
      })}
      <circle r={OUTER_RADIUS} fill="none" stroke="var(--color-rule-strong)" strokeWidth={1.5} />
      <circle r={DENTATE_R} fill="none" stroke="var(--color-ink-soft)" strokeWidth={DENTATE_RING.width} strokeDasharray={DENTATE_RING.dash} />
      <circle r={VERGE_R} fill="none" stroke="var(--color-ink)" strokeWidth={VERGE_RING.width} />
      <circle r={INNER_R} fill="var(--color-paper)" stroke="var(--color-rule-strong)" strokeWidth={1} />
      {TICKS.map((h) => {
        const a = (h * Math.PI) / 6;
        const whole = Number.isInteger(h);
        const p0 = polar(a, OUTER_RADIUS);
        const p1 = polar(a, OUTER_RADIUS + (whole ? 10 : 5));
        return <line key={`tick-${h}`} x1={p0.x} y1={p0.y} x2={p1.x} y2={p1.y} stroke="var(--color-ink)" strokeWidth={whole ? 2 : 1} />;
      })}
      {Array.from({ length: 12 }, (_, i) => {
        const p = polar((i * Math.PI) / 6, NUMBER_RADIUS);
        // Numbers are display hours; the data attribute carries the stored hour drawn there.
        return (
          <text key={`n-${i}`} x={p.x} y={p.y + 7} textAnchor="middle" fontSize={20} fontWeight={700} fill="var(--color-ink)" data-display-hour={i} data-stored-hour={fromDisplayHours(i, conv)}>
            {displayHour(i)}
          </text>
        );
      })}
      {CARDINAL_DISPLAY_HOURS.map((d) => {
        const label = anatomicalLabelAt(d, conv);
        const side = d === 3 ? 1 : d === 9 ? -1 : 0;
        const p = side === 0 ? polar((d * Math.PI) / 6, LABEL_RADIUS) : { x: side * (NUMBER_RADIUS + 24), y: 0 };
        return (
          <text
            key={`a-${d}`}
            x={p.x}
            y={p.y + (d === 6 ? 10 : 0)}
            // Side labels read along the edge, so the face can use the width for itself.
            transform={side === 0 ? undefined : `rotate(${side * 90} ${p.x} ${p.y})`}
            textAnchor="middle"
            fontSize={16}
            fontStyle="italic"
            fill="var(--color-lagoon-700)"
            data-anatomical-at={d}
          >
            {label}
          </text>
        );
      })}
    </g>
  );
}

/**
 * The names of the verge and dentate-line rings. Drawn in the top layer, over the lesions, with a
 * paper halo: a lesion at 12 o'clock must not hide which ring is which. Taps pass through.
 */
export function RingLabels() {
  return (
    <g pointerEvents="none" data-ring-labels="">
      <text x={0} y={-(VERGE_R - 4)} dy={-6} textAnchor="middle" fontSize={11} fill="var(--color-ink)" stroke="var(--color-paper)" strokeWidth={3} paintOrder="stroke">verge</text>
      <text x={0} y={-(DENTATE_R - 4)} dy={-4} textAnchor="middle" fontSize={11} fill="var(--color-ink)" stroke="var(--color-paper)" strokeWidth={3} paintOrder="stroke">dentate line</text>
    </g>
  );
}

export const MapFace = memo(MapFaceInner);
