import { describe, expect, it } from "vitest";
import { dragHandle, moveExtent, resizeArc } from "./extent-math";

// Gestures on a lesion recorded as the whole circumference (0 → 12, lib/geometry/arcs.ts): turning
// a ring leaves it as it is; narrowing or moving one end opens it into an ordinary arc.
const ring = { clockStartH: 0, clockEndH: 12, distanceStartCm: 1, distanceEndCm: 2 };

describe("editing a circumferential lesion on the map", () => {
  it("keeps the ring when the lesion is moved round, and only changes its depth", () => {
    expect(moveExtent(ring, 3, 0.5)).toEqual({ clockStartH: 0, clockEndH: 12, distanceStartCm: 1.5, distanceEndCm: 2.5 });
  });
  it("does not widen a ring; narrowing by half an hour leaves 11.5 of 12 hours", () => {
    expect(resizeArc(ring, 0.5)).toEqual(ring);
    expect(resizeArc(ring, -0.5)).toMatchObject({ clockStartH: 0, clockEndH: 11.5 });
  });
  it("opens the ring when its start is dragged: the end stays at 12 o'clock, stored as 0", () => {
    expect(dragHandle(ring, "start", 3, 1.5, "lithotomy")).toMatchObject({ clockStartH: 3, clockEndH: 0 });
  });
});
