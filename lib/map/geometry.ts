// Where things sit on the drawn clock face. The stored frame never changes (lib/geometry):
// a display convention only turns the face, so every drawing goes stored → display hours
// → angle, and every pointer goes angle → display hours → stored.
//
// Orientation of the drawing (also stated in the legend): we look INTO the canal, so the
// centre is the deepest point (distal rectum) and the outermost ring is the perianal skin
// outside the verge. Distance from the verge therefore shrinks the radius.
import { scaleLinear } from "d3-scale";
import { arc } from "d3-shape";
import {
  DEFAULT_ZONE_BOUNDS,
  arcLengthH,
  arcToRadians,
  fromDisplayHours,
  normalizeHours,
  toDisplayHours,
  type DisplayConvention,
} from "@/lib/geometry";

/** The viewBox, centred on the clock centre; the side labels at 3 and 9 run vertically to save width. */
export const VIEW = { minX: -284, minY: -280, width: 568, height: 560 } as const;
export const VIEW_BOX = `${VIEW.minX} ${VIEW.minY} ${VIEW.width} ${VIEW.height}`;

const B = DEFAULT_ZONE_BOUNDS;
/** Deepest and outermost distances drawn. */
export const MAP_MAX_CM = B.rectumUpToCm;
export const MAP_MIN_CM = -B.perianalOuterCm;

// Piecewise linear: the canal, where most lesions are, gets the most room per cm; the
// rectum and the skin are compressed. Still one d3 scaleLinear (a polylinear domain).
export const radiusOfCm = scaleLinear<number, number>()
  .domain([B.rectumUpToCm, B.canalLengthCm, 0, -B.perianalOuterCm])
  .range([26, 64, 172, 212])
  .clamp(true);

export const OUTER_RADIUS = radiusOfCm(MAP_MIN_CM);
export const NUMBER_RADIUS = 234;
export const LABEL_RADIUS = 258;

export type Point = { x: number; y: number };
export type Site = { storedH: number; cm: number };

/** Angle in radians, clockwise from the top of the screen, for a stored hour in a convention. */
export function angleOf(storedH: number, conv: DisplayConvention): number {
  return (toDisplayHours(storedH, conv) * Math.PI) / 6;
}

export function polar(angle: number, r: number): Point {
  return { x: r * Math.sin(angle), y: -r * Math.cos(angle) };
}

/** Where a stored clock position and distance are drawn, in viewBox units. */
export function pointOfSite(storedH: number, cm: number, conv: DisplayConvention): Point {
  return polar(angleOf(storedH, conv), radiusOfCm(cm));
}

/** A viewBox point back to the stored frame; distance clamped to the drawn range. */
export function siteOfPoint(p: Point, conv: DisplayConvention): Site {
  const displayH = normalizeHours((Math.atan2(p.x, -p.y) * 6) / Math.PI);
  return { storedH: fromDisplayHours(displayH, conv), cm: radiusOfCm.invert(Math.hypot(p.x, p.y)) };
}

export type SectorGeometry = { innerRadius: number; outerRadius: number; startAngle: number; endAngle: number };

/** One generator for every sector on the map; created once, not per render. */
export const sectorPath = arc<SectorGeometry>()
  .innerRadius((d) => d.innerRadius)
  .outerRadius((d) => d.outerRadius)
  .startAngle((d) => d.startAngle)
  .endAngle((d) => d.endAngle);

export type MapExtent = { clockStartH: number; clockEndH: number; distanceStartCm: number; distanceEndCm: number };

/** Below both sizes a lesion is drawn as a point marker rather than a sector. */
export const POINT_MAX_H = 0.5;
export const POINT_MAX_CM = 0.5;
/** Thin but real arcs still get this much angle so they can be seen and hit. */
const MIN_DRAWN_H = 0.2;

export function isPointLesion(e: MapExtent): boolean {
  return arcLengthH({ startH: e.clockStartH, endH: e.clockEndH }) < POINT_MAX_H && Math.abs(e.distanceEndCm - e.distanceStartCm) < POINT_MAX_CM;
}

/** Sector geometry of an extent in the active convention (the deeper end is the inner radius). */
export function sectorOf(e: MapExtent, conv: DisplayConvention, padPx = 0): SectorGeometry {
  const startD = toDisplayHours(e.clockStartH, conv);
  let length = arcLengthH({ startH: e.clockStartH, endH: e.clockEndH });
  let startH = startD;
  if (length < MIN_DRAWN_H) {
    startH = startD + length / 2 - MIN_DRAWN_H / 2;
    length = MIN_DRAWN_H;
  }
  const { startAngle, endAngle } = arcToRadians({ startH: normalizeHours(startH), endH: normalizeHours(startH) + length }); // keeps 0 → 12 a ring
  const deep = Math.max(e.distanceStartCm, e.distanceEndCm);
  const shallow = Math.min(e.distanceStartCm, e.distanceEndCm);
  let inner = radiusOfCm(deep);
  let outer = radiusOfCm(shallow);
  if (outer - inner < 6) {
    const mid = (outer + inner) / 2;
    inner = mid - 3;
    outer = mid + 3;
  }
  const padAngle = padPx / Math.max(outer, 1);
  return { innerRadius: Math.max(0, inner - padPx), outerRadius: outer + padPx, startAngle: startAngle - padAngle, endAngle: endAngle + padAngle };
}

/** The middle of an extent, in stored hours and cm: where labels, tags and point markers go. */
export function centreOf(e: MapExtent): Site {
  const length = arcLengthH({ startH: e.clockStartH, endH: e.clockEndH });
  return { storedH: normalizeHours(e.clockStartH + length / 2), cm: (e.distanceStartCm + e.distanceEndCm) / 2 };
}
