// Circular-arc arithmetic for the matcher (widening of point-like arcs, overlap of start + length
// pairs); 12 clock hours make a full turn. What an arc's length is, the full circle 0 → 12
// included, is lib/geometry's one definition.
import { arcLengthH as geometryArcLengthH, isFullCircle } from "@/lib/geometry/arcs";

export const HOURS_PER_TURN = 12;

/** A clockwise arc on the clock face, from startH to endH, hours in [0, 12). */
export interface ClockArc {
  startH: number;
  endH: number;
}

/** Brings any hour value into [0, 12), so arcs that cross 12 o'clock compare correctly. */
export function normalizeHour(hour: number): number {
  const h = hour % HOURS_PER_TURN;
  const wrapped = h < 0 ? h + HOURS_PER_TURN : h;
  // -0 and a value that rounds up to 12 both belong at 12 o'clock, which is 0.
  return wrapped === HOURS_PER_TURN || Object.is(wrapped, -0) ? 0 : wrapped;
}

/** Clockwise length in hours: startH === endH is a point (0), 0 → 12 the full ring (lib/geometry/arcs.ts). */
export function arcLengthH(arc: ClockArc): number {
  return geometryArcLengthH(arc);
}

/** Point-like arcs are widened about their middle so that tiny lesions can still overlap. */
export function widenArc(arc: ClockArc, minLengthH: number): { startH: number; lengthH: number } {
  const lengthH = arcLengthH(arc);
  const startH = normalizeHour(arc.startH);
  if (lengthH >= minLengthH) return { startH, lengthH };
  const middleH = startH + lengthH / 2;
  return { startH: normalizeHour(middleH - minLengthH / 2), lengthH: minLengthH };
}

function linearOverlap(a0: number, a1: number, b0: number, b1: number): number {
  return Math.max(0, Math.min(a1, b1) - Math.max(a0, b0));
}

/** Shared length in hours of two clockwise arcs given as start + length, correct across 12 o'clock. */
export function overlapLengthH(
  a: { startH: number; lengthH: number },
  b: { startH: number; lengthH: number },
): number {
  const a0 = normalizeHour(a.startH);
  const b0 = normalizeHour(b.startH);
  let total = 0;
  // An arc of at most one turn can meet the other in its own turn or one turn either side.
  for (const shift of [-HOURS_PER_TURN, 0, HOURS_PER_TURN]) {
    total += linearOverlap(a0, a0 + a.lengthH, b0 + shift, b0 + shift + b.lengthH);
  }
  return Math.min(total, a.lengthH, b.lengthH);
}

/** Overlap of two arcs after widening: length in hours and each arc's widened length. */
export function compareArcs(
  a: ClockArc,
  b: ClockArc,
  minLengthH = 0.5,
): { overlapH: number; lengthAH: number; lengthBH: number } {
  const wa = widenArc(a, minLengthH);
  const wb = widenArc(b, minLengthH);
  return { overlapH: overlapLengthH(wa, wb), lengthAH: wa.lengthH, lengthBH: wb.lengthH };
}

/** Rotates an arc clockwise by a number of hours (used for display and for invariance tests). */
export function rotateArc<T extends ClockArc>(arc: T, byH: number): T {
  const startH = normalizeHour(arc.startH + byH);
  const isRing = isFullCircle(arc);
  return { ...arc, startH, endH: isRing ? startH + HOURS_PER_TURN : normalizeHour(arc.endH + byH) };
}
