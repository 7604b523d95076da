// Clock-face arithmetic in Dentate's one stored frame.
//
// Stored frame (every clock value in the database and in lib/ uses it):
// - Clock position in the LITHOTOMY convention: 12 o'clock anterior, 6 posterior,
//   3 the patient's left lateral, 9 the patient's right lateral. Stored as decimal
//   hours in [0, 12); 12 o'clock is stored as 0. Other exam positions are display
//   conventions only (see conventions.ts), so a record never depends on how the
//   patient lay.
// - Distance from the anal verge in cm, SIGNED: positive = inside the canal
//   (proximal to the verge); negative = perianal skin outside the verge, measured
//   radially outward, down to -5 cm (the AJCC 8th perianal radius, see zones.ts).
// - 30 degrees of arc per clock hour (360 / 12). Angles run clockwise as drawn,
//   0 at 12 o'clock, which is also d3-shape's arc convention.

export const HOURS_PER_CIRCLE = 12;
export const DEGREES_PER_HOUR = 360 / HOURS_PER_CIRCLE;

function assertFinite(value: number, name: string): void {
  if (!Number.isFinite(value)) throw new RangeError(`${name} must be a finite number, got ${value}`);
}

/**
 * Any hour value → [0, 12). A value already in range comes back exactly as it was (adding 12
 * and taking the remainder would turn 6.29 into 6.289999999999999, and an untouched lesion
 * would look moved). `%` itself is exact; only the wrap of a negative remainder rounds, and a
 * tiny negative input would round up to 12, so that becomes 0.
 */
export function normalizeHours(h: number): number {
  assertFinite(h, "hours");
  let r = h % HOURS_PER_CIRCLE;
  if (r < 0) r += HOURS_PER_CIRCLE;
  return r >= HOURS_PER_CIRCLE || Object.is(r, -0) ? 0 : r;
}

/** Clockwise degrees from 12 o'clock, in [0, 360). */
export function hoursToDegrees(h: number): number {
  return normalizeHours(h) * DEGREES_PER_HOUR;
}

export function degreesToHours(deg: number): number {
  assertFinite(deg, "degrees");
  return normalizeHours(deg / DEGREES_PER_HOUR);
}

/** Radians for d3-shape arcs (0 at 12 o'clock, clockwise), in [0, 2π). */
export function hoursToRadians(h: number): number {
  return (normalizeHours(h) * Math.PI) / 6;
}

/** The whole clock hour nearest to h, as a person reads it: 1..12 (stored 0 → 12). */
export function displayHour(h: number): number {
  const nearest = Math.round(normalizeHours(h)) % HOURS_PER_CIRCLE;
  return nearest === 0 ? 12 : nearest;
}

/** Snap to the nearest multiple of step (the map editor's grid), kept in [0, 12). */
export function snapHours(h: number, step = 0.5): number {
  assertFinite(h, "hours");
  if (!(step > 0)) throw new RangeError("step must be positive");
  return normalizeHours(Math.round(h / step) * step);
}

/** Snap a signed distance to the nearest multiple of step; never returns -0. */
export function snapCm(cm: number, step = 0.5): number {
  assertFinite(cm, "distance");
  if (!(step > 0)) throw new RangeError("step must be positive");
  const snapped = Math.round(cm / step) * step;
  return snapped === 0 ? 0 : snapped;
}

/** "3 o'clock" on the hour, "3:30" otherwise; rounded to the minute. */
export function formatClock(h: number): string {
  const minutesInCircle = HOURS_PER_CIRCLE * 60;
  const totalMinutes = Math.round(normalizeHours(h) * 60) % minutesInCircle;
  const hour = Math.floor(totalMinutes / 60);
  const minute = totalMinutes % 60;
  const shown = hour === 0 ? 12 : hour;
  return minute === 0 ? `${shown} o'clock` : `${shown}:${String(minute).padStart(2, "0")}`;
}
