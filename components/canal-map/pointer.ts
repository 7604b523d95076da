import { VIEW, type Point } from "@/lib/map/geometry";

/**
 * Screen (client) coordinates → viewBox coordinates. The screen CTM handles any CSS
 * transform; where it is missing (jsdom, some old WebViews) the bounding rectangle and the
 * default preserveAspectRatio ("xMidYMid meet") give the same answer for an untransformed SVG.
 */
export function clientToSvg(svg: SVGSVGElement, clientX: number, clientY: number): Point {
  const ctm = typeof svg.getScreenCTM === "function" ? svg.getScreenCTM() : null;
  if (ctm && typeof DOMPoint !== "undefined") {
    const p = new DOMPoint(clientX, clientY).matrixTransform(ctm.inverse());
    return { x: p.x, y: p.y };
  }
  const rect = svg.getBoundingClientRect();
  const scale = Math.min(rect.width / VIEW.width, rect.height / VIEW.height) || 1;
  const offsetX = (rect.width - VIEW.width * scale) / 2;
  const offsetY = (rect.height - VIEW.height * scale) / 2;
  return {
    x: VIEW.minX + (clientX - rect.left - offsetX) / scale,
    y: VIEW.minY + (clientY - rect.top - offsetY) / scale,
  };
}

