// Editing arithmetic for lesion extents. Gestures work in DISPLAY hours (what the hand does
// on screen) and convert to stored hours at the end, so the result never depends on the
// convention. All values snap to the editor grid: 0.5 h and 0.5 cm.
import { arcLengthH, fromDisplayHours, isFullCircle, normalizeHours, snapCm, snapHours, toDisplayHours, type DisplayConvention } from "@/lib/geometry";
import type { MapExtent } from "@/components/canal-map";

export const STEP_H = 0.5;
export const STEP_CM = 0.5;
export const MIN_CM = -5;
export const MAX_CM = 8;
/** Gestures stop one step short of the full circle; the whole circumference (0 → 12) is the form's control. */
export const MAX_ARC_H = 12 - STEP_H;

const clampCm = (cm: number) => Math.min(MAX_CM, Math.max(MIN_CM, cm));
const snapSigned = (h: number) => Math.round(h / STEP_H) * STEP_H;

/** Shortest signed turn from a to b in hours, in (-6, 6]: a pointer never jumps half the face. */
export function turnH(fromH: number, toH: number): number {
  const d = normalizeHours(toH - fromH);
  return d > 6 ? d - 12 : d;
}

/** Default extent for a tap: 1 h × 1 cm centred on the snapped point. */
export function tapExtent(displayH: number, cm: number, conv: DisplayConvention): MapExtent {
  const h = snapHours(displayH, STEP_H);
  const c = clampCm(snapCm(cm, STEP_CM));
  return {
    clockStartH: fromDisplayHours(h - 0.5, conv),
    clockEndH: fromDisplayHours(h + 0.5, conv),
    distanceStartCm: clampCm(c - 0.5),
    distanceEndCm: clampCm(c + 0.5),
  };
}

/**
 * A drag from an anchor: the signed sweep (accumulated while the pointer moved, so the
 * direction is the direction the hand went, across 12 o'clock too) gives the arc; the radial
 * travel gives the distance range. A sweep or a travel shorter than one step falls back to
 * the tap default in that dimension.
 */
export function sweepExtent(anchorDisplayH: number, anchorCm: number, sweepH: number, cm: number, conv: DisplayConvention): MapExtent {
  const tap = tapExtent(anchorDisplayH, anchorCm, conv);
  const a = snapHours(anchorDisplayH, STEP_H);
  const s = Math.max(-MAX_ARC_H, Math.min(MAX_ARC_H, snapSigned(sweepH)));
  const arc =
    Math.abs(s) < STEP_H
      ? { clockStartH: tap.clockStartH, clockEndH: tap.clockEndH }
      : s > 0
        ? { clockStartH: fromDisplayHours(a, conv), clockEndH: fromDisplayHours(a + s, conv) }
        : { clockStartH: fromDisplayHours(a + s, conv), clockEndH: fromDisplayHours(a, conv) };
  const c0 = clampCm(snapCm(anchorCm, STEP_CM));
  const c1 = clampCm(snapCm(cm, STEP_CM));
  const dist =
    Math.abs(c1 - c0) < STEP_CM
      ? { distanceStartCm: tap.distanceStartCm, distanceEndCm: tap.distanceEndCm }
      : { distanceStartCm: Math.min(c0, c1), distanceEndCm: Math.max(c0, c1) };
  return { ...arc, ...dist };
}

/** Move a whole extent by a turn and a depth change, keeping its size. */
export function moveExtent(e: MapExtent, dH: number, dCm: number): MapExtent {
  const h = snapSigned(dH);
  let c = Math.round(dCm / STEP_CM) * STEP_CM;
  const lo = Math.min(e.distanceStartCm, e.distanceEndCm);
  const hi = Math.max(e.distanceStartCm, e.distanceEndCm);
  c = Math.min(MAX_CM - hi, Math.max(MIN_CM - lo, c));
  const ring = isFullCircle({ startH: e.clockStartH, endH: e.clockEndH }); // turning a ring leaves it as it is
  return {
    clockStartH: ring ? e.clockStartH : normalizeHours(e.clockStartH + h),
    clockEndH: ring ? e.clockEndH : normalizeHours(e.clockEndH + h),
    distanceStartCm: lo + c,
    distanceEndCm: hi + c,
  };
}

/** Widen (+) or narrow (−) the arc at its clockwise end; never below a point, never a full turn. */
export function resizeArc(e: MapExtent, dH: number): MapExtent {
  // A ring cannot widen; narrowing opens it from 12 o'clock (0 → 11:30 for one step).
  if (isFullCircle({ startH: e.clockStartH, endH: e.clockEndH }) && dH >= 0) return e;
  const length = Math.min(MAX_ARC_H, Math.max(0, arcLengthH({ startH: e.clockStartH, endH: e.clockEndH }) + dH));
  return { ...e, clockEndH: normalizeHours(e.clockStartH + length) };
}

/** Deepen (+) or shorten (−) the distance range at its deep end; never shallower than its start. */
export function resizeDepth(e: MapExtent, dCm: number): MapExtent {
  const lo = Math.min(e.distanceStartCm, e.distanceEndCm);
  const hi = Math.max(e.distanceStartCm, e.distanceEndCm);
  return { ...e, distanceStartCm: lo, distanceEndCm: Math.min(MAX_CM, Math.max(lo, hi + dCm)) };
}

export type HandleKind = "start" | "end" | "inner" | "outer";

/**
 * Where the edge a handle moves lies now (display hours, cm). A handle is dragged by the pointer's
 * travel from where it was pressed, added to this: the grip sits a little outside the edge, so
 * the edge must not jump to the pointer on the first move.
 */
export function handleEdge(e: MapExtent, kind: HandleKind, conv: DisplayConvention): { displayH: number; cm: number } {
  const lo = Math.min(e.distanceStartCm, e.distanceEndCm);
  const hi = Math.max(e.distanceStartCm, e.distanceEndCm);
  const midH = toDisplayHours(e.clockStartH, conv) + arcLengthH({ startH: e.clockStartH, endH: e.clockEndH }) / 2;
  if (kind === "start") return { displayH: toDisplayHours(e.clockStartH, conv), cm: (lo + hi) / 2 };
  if (kind === "end") return { displayH: toDisplayHours(e.clockEndH, conv), cm: (lo + hi) / 2 };
  return { displayH: normalizeHours(midH), cm: kind === "inner" ? hi : lo };
}

/** Drag one handle to a snapped point: an end of the arc, or one edge of the distance range. */
export function dragHandle(e: MapExtent, kind: HandleKind, displayH: number, cm: number, conv: DisplayConvention): MapExtent {
  const storedH = fromDisplayHours(snapHours(displayH, STEP_H), conv);
  const c = clampCm(snapCm(cm, STEP_CM));
  const lo = Math.min(e.distanceStartCm, e.distanceEndCm);
  const hi = Math.max(e.distanceStartCm, e.distanceEndCm);
  switch (kind) {
    case "start":
      // Moving the start of a ring opens it: its end stays at 12 o'clock, stored as 0.
      return { ...e, clockStartH: storedH, clockEndH: normalizeHours(e.clockEndH) };
    case "end":
      return { ...e, clockEndH: storedH };
    case "inner":
      return { ...e, distanceStartCm: Math.min(lo, c), distanceEndCm: Math.max(lo, c) };
    case "outer":
      return { ...e, distanceStartCm: Math.min(hi, c), distanceEndCm: Math.max(hi, c) };
  }
}

export function sameExtent(a: MapExtent, b: MapExtent): boolean {
  return a.clockStartH === b.clockStartH && a.clockEndH === b.clockEndH && a.distanceStartCm === b.distanceStartCm && a.distanceEndCm === b.distanceEndCm;
}
