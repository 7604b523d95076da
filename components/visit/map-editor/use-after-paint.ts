"use client";
// A value that follows another once the browser has painted the frame the change belongs to:
// the canal map answers a tap in that frame, and the panels beside it (inspector, follow-up
// list, lesion table) catch up just after, in an interruptible transition. The usual "yield
// after the visual feedback" pattern for responsive input; the bench reports both figures
// (tap until the map is painted, and until the inspector is).
import { startTransition, useEffect, useState } from "react";

/** `value` must keep its identity while nothing in it changes (build it with useMemo). */
export function useAfterPaint<T>(value: T): T {
  const [shown, setShown] = useState(value);
  useEffect(() => {
    if (Object.is(shown, value)) return;
    let timer: ReturnType<typeof setTimeout> | undefined;
    // The frame callback runs just before the paint; a task queued from it runs just after.
    const frame = requestAnimationFrame(() => {
      timer = setTimeout(() => startTransition(() => setShown(value)), 0);
    });
    return () => {
      cancelAnimationFrame(frame);
      if (timer !== undefined) clearTimeout(timer);
    };
  }, [value, shown]);
  return shown;
}
