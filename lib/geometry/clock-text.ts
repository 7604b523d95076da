import { HOURS_PER_CIRCLE, normalizeHours } from "./clock";

// Clock positions typed and shown in a field as hours and minutes ("2:30", "12:00"), the same
// notation as every table and label (formatClock), never as decimal hours ("2.5").

/** "2:30" for 2.5 h, "12:00" for 0 h. */
export function clockText(h: number): string {
  const total = Math.round(normalizeHours(h) * 60) % (HOURS_PER_CIRCLE * 60);
  const hour = Math.floor(total / 60);
  return `${hour === 0 ? 12 : hour}:${String(total % 60).padStart(2, "0")}`;
}

/** Reads "2:30", "2.30" (read as 2:30), "2" or "12"; null for anything else. 12 reads as 0 h. */
export function parseClockText(s: string): number | null {
  const m = /^\s*(\d{1,2})(?:[:.](\d{2}))?\s*$/.exec(s);
  if (!m) return null;
  const hour = Number(m[1]);
  const minute = m[2] === undefined ? 0 : Number(m[2]);
  if (hour < 1 || hour > 12 || minute > 59) return null;
  return ((hour % 12) + minute / 60) % HOURS_PER_CIRCLE;
}
