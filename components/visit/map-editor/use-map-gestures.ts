// Pointer gestures on the canal map: place (tap), sweep (drag from a tap), move a lesion,
// drag a handle. Pointer events cover mouse, pen and a gloved finger alike. During a drag only
// a local preview changes; the owner hears about it once, on pointerup.
import { useCallback, useRef, useState, type PointerEvent } from "react";
import { clientToSvg, OUTER_RADIUS, siteOfPoint, type MapExtent } from "@/components/canal-map";
import { normalizeHours, toDisplayHours, type DisplayConvention } from "@/lib/geometry";
import { dragHandle, handleEdge, moveExtent, sameExtent, sweepExtent, tapExtent, turnH, type HandleKind } from "./extent-math";

type Gesture =
  | { kind: "create" }
  | { kind: "move"; id: string; from: MapExtent }
  | { kind: "handle"; id: string; handle: HandleKind; from: MapExtent };

interface Active {
  gesture: Gesture;
  pointerId: number;
  /** Where the pointer went down, in CSS pixels, and whether it has since travelled. */
  downX: number;
  downY: number;
  travelled: boolean;
  anchorDisplayH: number;
  anchorCm: number;
  lastDisplayH: number;
  sweepH: number;
  extent: MapExtent | null;
}

export type Preview = { id: string | null; extent: MapExtent };

interface Options {
  svgRef: React.RefObject<SVGSVGElement | null>;
  conv: DisplayConvention;
  enabled: boolean;
  onCreate: (extent: MapExtent) => void;
  onChange: (id: string, extent: MapExtent) => void;
}

/** Taps beyond the drawn face (on the numbers and labels) do not place anything. */
const FACE_SLACK = 14;
/**
 * A press on a lesion or a handle that travels less than this (CSS px) is a tap: it selects
 * and changes nothing, even where the lesion lies off the editor's grid and a drag of zero
 * steps would snap it.
 */
const TAP_SLOP_PX = 4;

export function useMapGestures({ svgRef, conv, enabled, onCreate, onChange }: Options) {
  const active = useRef<Active | null>(null);
  const [preview, setPreview] = useState<Preview | null>(null);

  const locate = useCallback(
    (e: PointerEvent) => {
      const svg = svgRef.current;
      if (!svg) return null;
      const p = clientToSvg(svg, e.clientX, e.clientY);
      const site = siteOfPoint(p, conv);
      return { p, displayH: toDisplayHours(site.storedH, conv), cm: site.cm, r: Math.hypot(p.x, p.y) };
    },
    [svgRef, conv],
  );

  const begin = useCallback(
    (e: PointerEvent, gesture: Gesture) => {
      const at = locate(e);
      if (!at) return false;
      if (gesture.kind === "create" && at.r > OUTER_RADIUS + FACE_SLACK) return false;
      active.current = { gesture, pointerId: e.pointerId, downX: e.clientX, downY: e.clientY, travelled: false, anchorDisplayH: at.displayH, anchorCm: at.cm, lastDisplayH: at.displayH, sweepH: 0, extent: null };
      try {
        svgRef.current?.setPointerCapture?.(e.pointerId);
      } catch {
        // Capture is an optimisation (moves outside the SVG keep coming); without it we still work.
      }
      if (gesture.kind === "create") {
        const extent = tapExtent(at.displayH, at.cm, conv);
        active.current.extent = extent;
        setPreview({ id: null, extent });
      }
      return true;
    },
    [locate, svgRef, conv],
  );

  const step = useCallback(
    (e: PointerEvent) => {
      const a = active.current;
      if (!a || e.pointerId !== a.pointerId) return;
      if (a.gesture.kind !== "create" && !a.travelled && Math.hypot(e.clientX - a.downX, e.clientY - a.downY) < TAP_SLOP_PX) return;
      a.travelled = true;
      const at = locate(e);
      if (!at) return;
      a.sweepH += turnH(a.lastDisplayH, at.displayH);
      a.lastDisplayH = at.displayH;
      const g = a.gesture;
      let extent: MapExtent;
      if (g.kind === "create") extent = sweepExtent(a.anchorDisplayH, a.anchorCm, a.sweepH, at.cm, conv);
      else if (g.kind === "move") extent = moveExtent(g.from, a.sweepH, at.cm - a.anchorCm);
      else {
        const edge = handleEdge(g.from, g.handle, conv);
        extent = dragHandle(g.from, g.handle, normalizeHours(edge.displayH + a.sweepH), edge.cm + (at.cm - a.anchorCm), conv);
      }
      if (a.extent && sameExtent(a.extent, extent)) return;
      a.extent = extent;
      setPreview({ id: g.kind === "create" ? null : g.id, extent });
    },
    [locate, conv],
  );

  const end = useCallback(
    (e: PointerEvent, cancelled = false) => {
      const a = active.current;
      if (!a || e.pointerId !== a.pointerId) return;
      if (!cancelled) step(e);
      active.current = null;
      setPreview(null);
      if (cancelled || !a.extent) return;
      const g = a.gesture;
      if (g.kind === "create") onCreate(a.extent);
      else if (!sameExtent(g.from, a.extent)) onChange(g.id, a.extent);
    },
    [step, onCreate, onChange],
  );

  const svgHandlers = {
    onPointerDown: (e: PointerEvent<Element>) => {
      if (!enabled || (e.pointerType === "mouse" && e.button !== 0)) return;
      if (begin(e, { kind: "create" })) e.preventDefault();
    },
    onPointerMove: (e: PointerEvent<Element>) => step(e),
    onPointerUp: (e: PointerEvent<Element>) => end(e),
    onPointerCancel: (e: PointerEvent<Element>) => end(e, true),
  };

  const startMove = useCallback((id: string, from: MapExtent, e: PointerEvent) => enabled && begin(e, { kind: "move", id, from }), [begin, enabled]);
  const startHandle = useCallback((id: string, handle: HandleKind, from: MapExtent, e: PointerEvent) => enabled && begin(e, { kind: "handle", id, handle, from }), [begin, enabled]);

  return { preview, svgHandlers, startMove, startHandle };
}
