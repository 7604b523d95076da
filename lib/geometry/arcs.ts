// Circular intervals on the clock face, in stored-frame hours (see clock.ts).
// An arc runs CLOCKWISE from startH to endH, so 11 → 1 is 2 h, not 10. When
// startH === endH the arc is a single point. The full circle is written 0 → 12: its end
// lies one whole turn past its start, which no other arc's does (stored hours are in
// [0, 12), and 12 is accepted as an end only after a start of 0: lib/validation/clock.ts).
// Geometry, tracking, the circumference checks, the map and the PDF all read it so.

import { HOURS_PER_CIRCLE, normalizeHours } from "./clock";

export type Arc = { startH: number; endH: number };

/** Tolerance for joining pieces that meet, so 10→12 and 12→2 merge despite rounding. */
const EPS_H = 1e-9;

/** The full circle as stored: 0 → 12. */
export function fullCircle(): Arc {
  return { startH: 0, endH: HOURS_PER_CIRCLE };
}

/** True when the arc goes once round: its end one whole turn (12 h) past its start (0 → 12, or 6 → 18 turned for display). */
export function isFullCircle(arc: Arc): boolean {
  return Math.abs(arc.endH - arc.startH - HOURS_PER_CIRCLE) <= EPS_H;
}

export function arcLengthH(arc: Arc): number {
  if (isFullCircle(arc)) return HOURS_PER_CIRCLE;
  return normalizeHours(arc.endH - arc.startH);
}

/** True when h lies on the arc, ends included. */
export function containsHour(arc: Arc, h: number): boolean {
  if (isFullCircle(arc)) return true;
  const offset = normalizeHours(h - arc.startH);
  const length = arcLengthH(arc);
  return offset <= length + EPS_H || offset >= HOURS_PER_CIRCLE - EPS_H;
}

type Piece = [from: number, to: number];

/** Unroll an arc onto the line [0, 12]: one piece, or two when it crosses 12 o'clock. */
function toPieces(arc: Arc): Piece[] {
  if (isFullCircle(arc)) return [[0, HOURS_PER_CIRCLE]];
  const start = normalizeHours(arc.startH);
  const end = start + arcLengthH(arc);
  if (end <= HOURS_PER_CIRCLE) return [[start, end]];
  return [
    [start, HOURS_PER_CIRCLE],
    [0, end - HOURS_PER_CIRCLE],
  ];
}

/**
 * Total length shared by two arcs. Two arcs can share two separate pieces
 * (10→4 and 2→12 share 10→12 and 2→4), which is why pieces are summed pairwise.
 */
export function overlapH(a: Arc, b: Arc): number {
  let total = 0;
  for (const [a0, a1] of toPieces(a)) {
    for (const [b0, b1] of toPieces(b)) {
      total += Math.max(0, Math.min(a1, b1) - Math.max(a0, b0));
    }
  }
  return Math.min(total, HOURS_PER_CIRCLE);
}

/** Disjoint arcs covering the same points, sorted by start; touching arcs are merged. */
export function unionArcs(arcs: readonly Arc[]): Arc[] {
  if (arcs.length === 0) return [];
  const pieces = arcs.flatMap(toPieces).sort((p, q) => p[0] - q[0] || p[1] - q[1]);
  const merged: Piece[] = [];
  for (const [from, to] of pieces) {
    const last = merged[merged.length - 1];
    if (last && from <= last[1] + EPS_H) last[1] = Math.max(last[1], to);
    else merged.push([from, to]);
  }
  if (merged.length === 1 && merged[0][0] <= EPS_H && merged[0][1] >= HOURS_PER_CIRCLE - EPS_H) {
    return [fullCircle()];
  }
  // A run ending at 12 and a run starting at 0 are one arc crossing 12 o'clock.
  const first = merged[0];
  const last = merged[merged.length - 1];
  if (merged.length > 1 && first[0] <= EPS_H && last[1] >= HOURS_PER_CIRCLE - EPS_H) {
    merged.shift();
    last[1] = HOURS_PER_CIRCLE + first[1];
  }
  return merged
    .map(([from, to]) => ({ startH: normalizeHours(from), endH: normalizeHours(to) }))
    .sort((p, q) => p.startH - q.startH);
}

export function unionLengthH(arcs: readonly Arc[]): number {
  return unionArcs(arcs).reduce((sum, arc) => sum + arcLengthH(arc), 0);
}

/** Share of the circumference covered by the arcs together, in [0, 1]. */
export function fractionOfCircumference(arcs: readonly Arc[]): number {
  return Math.min(1, Math.max(0, unionLengthH(arcs) / HOURS_PER_CIRCLE));
}

export function rotateArc(arc: Arc, dh: number): Arc {
  if (isFullCircle(arc)) return fullCircle(); // a ring has no start: the stored form
  return { startH: normalizeHours(arc.startH + dh), endH: normalizeHours(arc.endH + dh) };
}

/** The point halfway along the arc, clockwise from its start (where a label goes). */
export function arcMidpointH(arc: Arc): number {
  return normalizeHours(normalizeHours(arc.startH) + arcLengthH(arc) / 2);
}

/**
 * Angles for d3-shape's arc(): radians, 0 at 12 o'clock, clockwise. endAngle is
 * startAngle plus the length, so an arc crossing 12 o'clock is drawn the short way.
 */
export function arcToRadians(arc: Arc): { startAngle: number; endAngle: number } {
  const startAngle = (normalizeHours(arc.startH) * Math.PI) / 6;
  return { startAngle, endAngle: startAngle + (arcLengthH(arc) * Math.PI) / 6 };
}
