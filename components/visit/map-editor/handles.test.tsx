import { describe, expect, it, vi } from "vitest";
import { fireEvent, render } from "@testing-library/react";
import { createSelectionStore, polar, sectorOf, VIEW, type GhostLesion, type MapLesion } from "@/components/canal-map";
import { MapEditor, type MapEditorProps } from "./map-editor";

// What a finger can reach on the map: the grips of a small lesion's handles and the tag of an
// earlier track must not lie over the lesion (or the outline) they belong to, so a tap there still
// selects the lesion or draws one. Checked as geometry: jsdom has no hit testing.
const RECT = { left: 40, top: 30, width: VIEW.width * 2, height: VIEW.height * 2 };

function setup(over: Partial<MapEditorProps>) {
  const props: MapEditorProps = {
    lesions: [], convention: "lithotomy", readOnly: false, selection: createSelectionStore(), onSelect: vi.fn(), onCreate: vi.fn(), onChange: vi.fn(), onRequestDelete: vi.fn(), ...over,
  };
  const view = render(<MapEditor {...props} />);
  const svg = view.container.querySelector("svg")!;
  svg.getBoundingClientRect = () => ({ ...RECT, x: RECT.left, y: RECT.top, right: RECT.left + RECT.width, bottom: RECT.top + RECT.height, toJSON: () => RECT }) as DOMRect;
  return { ...view, props };
}
const toScreen = (p: { x: number; y: number }) => ({ clientX: RECT.left + (p.x - VIEW.minX) * 2, clientY: RECT.top + (p.y - VIEW.minY) * 2 });

/** Points spread over a drawn sector, edges included (viewBox units). */
function pointsOf(e: { clockStartH: number; clockEndH: number; distanceStartCm: number; distanceEndCm: number }) {
  const g = sectorOf(e, "lithotomy");
  const out: { x: number; y: number }[] = [];
  for (let i = 0; i <= 10; i++) for (let j = 0; j <= 10; j++) out.push(polar(g.startAngle + ((g.endAngle - g.startAngle) * i) / 10, g.innerRadius + ((g.outerRadius - g.innerRadius) * j) / 10));
  return out;
}
const num = (el: Element, a: string) => Number(el.getAttribute(a));

// A small lesion: half an hour of arc, half a centimetre deep.
const SMALL: MapLesion = { id: "l1", label: "L1", grade: "hsil", treated: false, biopsyLabels: [], clockStartH: 2, clockEndH: 2.5, distanceStartCm: 1, distanceEndCm: 1.5 };

describe("what a finger can reach on the map", () => {
  it("the grips of a small lesion's handles leave every point of the lesion free", () => {
    const { container } = setup({ lesions: [SMALL], selection: createSelectionStore("l1") });
    const handles = [...container.querySelectorAll("[data-handle]")];
    expect(handles).toHaveLength(4);
    for (const h of handles) {
      // The grip is the widest circle of the handle.
      const grip = [...h.querySelectorAll("circle")].sort((a, b) => num(b, "r") - num(a, "r"))[0]!;
      const c = { x: num(grip, "cx"), y: num(grip, "cy") };
      const nearest = Math.min(...pointsOf(SMALL).map((p) => Math.hypot(p.x - c.x, p.y - c.y)));
      expect(nearest, `${h.getAttribute("data-handle")} grip reaches over the lesion`).toBeGreaterThanOrEqual(num(grip, "r") - 0.01);
    }
  });

  it("a handle pressed on its grip moves its edge by the pointer's travel, without a jump", () => {
    const { container, props } = setup({ lesions: [SMALL], selection: createSelectionStore("l1") });
    const grip = container.querySelector('[data-handle="start"] [data-handle-hit]')!;
    const at = { x: num(grip, "cx"), y: num(grip, "cy") };
    const r = Math.hypot(at.x, at.y);
    const a = Math.atan2(at.x, -at.y);
    const opts = { pointerId: 1, button: 0, pointerType: "touch" };
    fireEvent.pointerDown(grip, { ...toScreen(at), ...opts });
    // One clock hour (30°, π/6) anticlockwise at the same radius: the start edge moves from 2 to 1.
    fireEvent.pointerMove(grip, { ...toScreen(polar(a - Math.PI / 12, r)), ...opts });
    fireEvent.pointerUp(grip, { ...toScreen(polar(a - Math.PI / 6, r)), ...opts });
    expect(props.onChange).toHaveBeenCalledWith("l1", { clockStartH: 1, clockEndH: 2.5, distanceStartCm: 1, distanceEndCm: 1.5 });
  });

  it("an earlier track's tap target is its label tag, clear of the outline, where a tap draws", () => {
    const ghost: GhostLesion = { id: "t1", trackLabel: "#12", grade: "hsil", clockStartH: 2, clockEndH: 2.5, distanceStartCm: 1, distanceEndCm: 1.5 };
    const { container } = setup({ ghosts: [ghost], onGhostSelect: vi.fn() });
    const hit = container.querySelector('[data-ghost-hit="t1"]')!;
    const box = hit.tagName === "circle"
      ? { x: num(hit, "cx") - num(hit, "r"), y: num(hit, "cy") - num(hit, "r"), w: 2 * num(hit, "r"), h: 2 * num(hit, "r") }
      : { x: num(hit, "x"), y: num(hit, "y"), w: num(hit, "width"), h: num(hit, "height") };
    const inside = pointsOf(ghost).filter((p) => p.x >= box.x && p.x <= box.x + box.w && p.y >= box.y && p.y <= box.y + box.h);
    expect(inside).toEqual([]);
    // The label is drawn in the tag it answers to.
    const text = container.querySelector('[data-ghost-id="t1"] text')!;
    expect(num(text, "x")).toBeGreaterThan(box.x);
    expect(num(text, "x")).toBeLessThan(box.x + box.w);
  });
});
