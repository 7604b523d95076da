import { z } from "zod";
import { HOURS_PER_CIRCLE } from "@/lib/geometry/clock";

// Clock hours at the boundary, for lesion extents and treated arcs alike. Hours are stored in
// the lithotomy frame in [0, 12) (12 o'clock is 0); the one exception is the whole
// circumference, written 0 → 12 (lib/geometry/arcs.ts, isFullCircle), so 12 is accepted as
// an end only after a start of 0.

export const clockStartH = z
  .number({ message: "Clock position must be a number of hours." })
  .min(0, "Clock hours run from 0 to 12.")
  .lt(HOURS_PER_CIRCLE, "Clock hours run from 0 up to (not including) 12; 12 o'clock is stored as 0.");

export const clockEndH = z
  .number({ message: "Clock position must be a number of hours." })
  .min(0, "Clock hours run from 0 to 12.")
  .max(HOURS_PER_CIRCLE, "Clock hours run from 0 to 12 (12 only as the end of the whole circumference, 0 → 12).");

export const FULL_CIRCLE_ONLY_MESSAGE = "An end of 12 means the whole circumference and needs a start of 0 (0 → 12); 12 o'clock is otherwise stored as 0.";

/** False when an end of 12 comes with a start other than 0 (or with no start in the same input). */
export function endOf12IsWholeCircle(start: number | undefined, end: number | undefined): boolean {
  return end !== HOURS_PER_CIRCLE || start === 0;
}
