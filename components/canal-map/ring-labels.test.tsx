import { describe, expect, it } from "vitest";
import { render } from "@testing-library/react";
import { CanalMap } from "./canal-map";

// A lesion at 12 o'clock sits exactly where the ring names are written: the names must be painted
// after (over) every lesion, in SVG painting order (later in the document is on top, SVG 1.1 §3.3).
describe("ring names on the map", () => {
  it("are drawn over a lesion at 12 o'clock and let taps through", () => {
    const lesion = { id: "l1", label: "L1", grade: "hsil" as const, clockStartH: 11.5, clockEndH: 0.5, distanceStartCm: 0, distanceEndCm: 2, treated: false, biopsyLabels: [] as string[], zone: "distal_canal" as const };
    const { container } = render(<CanalMap lesions={[lesion]} convention="lithotomy" />);
    const names = [...container.querySelectorAll("text")].filter((t) => t.textContent === "verge" || t.textContent === "dentate line");
    expect(names).toHaveLength(2);
    const body = container.querySelector("[data-layer=lesions]")!;
    for (const n of names) {
      expect(body.compareDocumentPosition(n) & Node.DOCUMENT_POSITION_FOLLOWING).toBeTruthy();
      expect(n.closest("[pointer-events=none]")).toBeTruthy();
    }
  });
});
