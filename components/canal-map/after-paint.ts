"use client";
// A value that follows another once the browser has painted the frame the change belongs to:
// the canal map answers a tap in that frame, and the panels beside it (inspector, follow-up
// list, lesion table) catch up a frame later, in an interruptible transition. The usual "yield
// after the visual feedback" pattern for responsive input; the bench reports both figures
// (tap until the map is painted, and until the inspector is).
import { startTransition, useEffect, useState } from "react";
import type { SelectionStore } from "./selection";

/**
 * Runs `fn` once the frame that answers the input is painted and the next frame has begun, so
 * it never delays either; returns a cancel function. The panels therefore show a change one
 * frame after the map does (about 17 ms later at 60 Hz).
 */
export function afterNextFrame(fn: () => void): () => void {
  let timer: ReturnType<typeof setTimeout> | undefined;
  let frame = 0;
  // A frame callback runs just before its frame is painted: the first is the map's frame,
  // the second the next one; a task queued from there runs after that frame's paint.
  frame = requestAnimationFrame(() => {
    frame = requestAnimationFrame(() => {
      timer = setTimeout(fn, 0);
    });
  });
  return () => {
    cancelAnimationFrame(frame);
    if (timer !== undefined) clearTimeout(timer);
  };
}

/** afterNextFrame, as an interruptible React transition. */
const afterPaint = (fn: () => void) => afterNextFrame(() => startTransition(fn));

/** `value` must keep its identity while nothing in it changes (build it with useMemo). */
export function useAfterPaint<T>(value: T): T {
  const [shown, setShown] = useState(value);
  useEffect(() => {
    if (Object.is(shown, value)) return;
    return afterPaint(() => setShown(value));
  }, [value, shown]);
  return shown;
}

/** The store's selection, as it was when the last frame was painted (for the panels). */
export function useSelectionAfterPaint(store: SelectionStore): string | null {
  const [shown, setShown] = useState(store.get);
  useEffect(() => {
    let cancel = () => {};
    const follow = () => {
      cancel();
      cancel = afterPaint(() => setShown(store.get()));
    };
    const unsubscribe = store.subscribe(follow);
    // A change between the first render and this subscription is not lost.
    follow();
    return () => {
      cancel();
      unsubscribe();
    };
  }, [store]);
  return shown;
}
