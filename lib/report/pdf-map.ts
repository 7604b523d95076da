import type PDFDocument from "pdfkit";
import { GRADE_ENCODING, BIOPSY_TAG, DENTATE_RING, TREATED_RING, VERGE_RING, type FillPattern, type LineTexture } from "@/lib/map/encoding";
import {
  OUTER_RADIUS, centreOf, isPointLesion, pointOfSite, polar, radiusOfCm, sectorOf, sectorPath,
} from "@/lib/map/geometry";
import { DEFAULT_ZONE_BOUNDS, anatomicalLabelAt, arcToRadians, zoneBands } from "@/lib/geometry";
import type { Grade } from "@/lib/domain/vocab";
import type { ReportBiopsy, ReportLesion, ReportTreatment } from "./types";

// The canal map as vector paths, drawn with the same geometry and the same grade encoding
// (pattern + outline) as the web map, translated to greys so that a greyscale print loses
// nothing. Drawn in the web map's viewBox units, scaled to fit the page.

type Doc = InstanceType<typeof PDFDocument>;

const INK = "#1a1a1a";
const NUMBER_RADIUS = OUTER_RADIUS + 32;
/** Greys for the five zone bands, outermost (skin) to deepest (rectum). */
const ZONE_GREYS = ["#f4f4f4", "#ffffff", "#e6e6e6", "#ffffff", "#f0f0f0"];
const GRADE_GREY: Record<Grade, string> = { benign: "#9a9a9a", condyloma: "#6e6e6e", lsil: "#4d4d4d", hsil: "#2b2b2b", suspected_cancer: "#000000" };

function dashOf(dash: string | undefined): number[] | null {
  return dash ? dash.split(/\s+/).map(Number) : null;
}

type Box = { x: number; y: number; w: number; h: number };
const FACE_BOX: Box = { x: -260, y: -260, w: 520, h: 520 };

/** Fill a path with the grade's pattern, clipped to the path; lines only cover the box. */
function fillPattern(doc: Doc, d: string, pattern: FillPattern, lines: LineTexture | undefined, grey: string, box: Box): void {
  doc.save();
  doc.path(d).clip();
  const { x, y, w, h } = box;
  if (pattern === "solid") {
    doc.rect(x, y, w, h).fill(grey);
  } else if (lines) {
    // The same parallel lines as the screen's pattern (lib/map/encoding.ts), turned about the box centre.
    const cx = x + w / 2, cy = y + h / 2, r = Math.hypot(w, h) / 2;
    doc.rotate(lines.angleDeg, { origin: [cx, cy] }).lineWidth(lines.width * 0.6).strokeColor(grey);
    for (let k = -r; k <= r; k += lines.spacing) doc.moveTo(cx - r, cy + k).lineTo(cx + r, cy + k).stroke();
  }
  doc.restore();
}

function outline(doc: Doc, d: string, grade: Grade): void {
  const enc = GRADE_ENCODING[grade];
  const dash = dashOf(enc.outlineDash);
  doc.save().lineWidth(enc.doubleOutline ? 2.2 : enc.outlineWidth).strokeColor(INK);
  if (dash) doc.dash(dash[0]!, { space: dash[1] ?? dash[0]! });
  doc.path(d).stroke();
  doc.restore();
}

function drawFace(doc: Doc): void {
  const bands = zoneBands();
  bands.forEach((b, i) => {
    const outer = radiusOfCm(b.fromCm);
    const inner = radiusOfCm(b.toCm);
    const d = sectorPath({ innerRadius: inner, outerRadius: outer, startAngle: 0, endAngle: 2 * Math.PI })!;
    doc.path(d).fill(ZONE_GREYS[i % ZONE_GREYS.length]!);
  });
  doc.save().lineWidth(0.6).strokeColor("#8a8a8a");
  for (const b of bands) doc.circle(0, 0, radiusOfCm(b.fromCm)).stroke();
  doc.restore();
  // The verge (heavy) and the dentate line (dash-dot), from the same table as the web map.
  doc.save().lineWidth(VERGE_RING.width * 0.6).strokeColor(INK).circle(0, 0, radiusOfCm(0)).stroke().restore();
  doc.save().lineWidth(DENTATE_RING.width * 0.6).strokeColor(INK);
  dashPath(doc, DENTATE_RING.dash, () => doc.circle(0, 0, radiusOfCm(DEFAULT_ZONE_BOUNDS.dentateLineCm)).stroke());
  doc.restore();
  doc.save().fontSize(14).fillColor(INK).font("Helvetica");
  for (let h = 0; h < 12; h++) {
    const a = (h * Math.PI) / 6;
    const p1 = polar(a, OUTER_RADIUS);
    const p2 = polar(a, OUTER_RADIUS + 18);
    doc.lineWidth(1).strokeColor(INK).moveTo(p1.x, p1.y).lineTo(p2.x, p2.y).stroke();
    const n = polar(a, NUMBER_RADIUS);
    const label = String(h === 0 ? 12 : h);
    doc.text(label, n.x - 14, n.y - 7, { width: 28, align: "center", lineBreak: false });
  }
  // Anatomical words beside the numbers: above 12, below 6, under the side numbers.
  doc.fontSize(13).font("Helvetica-Oblique");
  for (const h of [0, 3, 6, 9]) {
    const word = anatomicalLabelAt(h, "lithotomy") ?? "";
    const n = polar((h * Math.PI) / 6, NUMBER_RADIUS);
    const w = 120;
    const y = h === 0 ? n.y - 24 : n.y + 12;
    doc.text(word, n.x - w / 2, y, { width: w, align: "center", lineBreak: false });
  }
  doc.restore();
}

function drawLesion(doc: Doc, l: ReportLesion, grade: Grade): void {
  const enc = GRADE_ENCODING[grade];
  const grey = GRADE_GREY[grade];
  if (isPointLesion(l)) {
    const c = centreOf(l);
    const p = pointOfSite(c.storedH, c.cm, "lithotomy");
    const d = `M ${p.x - 9} ${p.y} a 9 9 0 1 0 18 0 a 9 9 0 1 0 -18 0 Z`;
    doc.path(d).fill("#ffffff");
    fillPattern(doc, d, enc.pattern, enc.lines, grey, FACE_BOX);
    outline(doc, d, grade);
  } else {
    const d = sectorPath(sectorOf(l, "lithotomy"))!;
    doc.path(d).fill("#ffffff");
    fillPattern(doc, d, enc.pattern, enc.lines, grey, FACE_BOX);
    outline(doc, d, grade);
    if (enc.doubleOutline) {
      doc.save().lineWidth(1.4).strokeColor(INK).path(sectorPath(sectorOf(l, "lithotomy", 4))!).stroke().restore();
    }
  }
  const c = centreOf(l);
  const at = pointOfSite(c.storedH, c.cm, "lithotomy");
  // A point lesion keeps its mark visible: its tag sits beside it, not on it.
  const p = isPointLesion(l) ? { x: at.x + (at.x < 0 ? -24 : 24), y: at.y } : at;
  const tagW = 8 + l.label.length * 7;
  doc.save().roundedRect(p.x - tagW / 2, p.y - 8, tagW, 16, 3).fillAndStroke("#ffffff", INK);
  doc.fillColor(INK).font("Helvetica-Bold").fontSize(11).text(l.label, p.x - tagW / 2, p.y - 5, { width: tagW, align: "center", lineBreak: false });
  doc.restore();
}

/** Strokes with a dash pattern of any length ("12 4 2 4" is dash-dot); pdfkit takes the array as PDF does. */
function dashPath(doc: Doc, pattern: string, stroke: () => void): void {
  const parts = pattern.split(/\s+/).map(Number);
  (doc.dash as unknown as (l: number[], o: object) => Doc).call(doc, parts, {});
  stroke();
  doc.undash();
}

/** Treated arcs as on the screen (TREATED_RING): a band between two rails, crossed by rungs. */
function drawTreatedArcs(doc: Doc, t: ReportTreatment): void {
  const inner = radiusOfCm(0) + TREATED_RING.innerGapPx;
  const outer = inner + TREATED_RING.widthPx;
  for (const a of t.arcs) {
    const { startAngle, endAngle } = arcToRadians(a);
    const band = sectorPath({ innerRadius: inner, outerRadius: outer, startAngle, endAngle })!;
    doc.save().path(band).fill("#ffffff").restore();
    doc.save().lineWidth(TREATED_RING.rail).strokeColor(INK).path(band).stroke().restore();
    const mid = (inner + outer) / 2;
    const [on, off] = TREATED_RING.rung.split(/\s+/).map(Number) as [number, number];
    const mid0 = polar(startAngle, mid);
    const mid1 = polar(endAngle, mid);
    const large = endAngle - startAngle > Math.PI ? 1 : 0;
    doc.save().lineWidth(TREATED_RING.widthPx - 2).strokeColor(INK).dash(on, { space: off })
      .path(`M ${mid0.x} ${mid0.y} A ${mid} ${mid} 0 ${large} 1 ${mid1.x} ${mid1.y}`).stroke().undash().restore();
  }
}

function drawBiopsy(doc: Doc, b: ReportBiopsy): void {
  const p = pointOfSite(b.clockH, b.distanceCm, "lithotomy");
  const s = BIOPSY_TAG.size;
  doc.save().lineWidth(1.6).rect(p.x - s / 2, p.y - s / 2, s, s).fillAndStroke("#ffffff", INK);
  doc.fillColor(INK).font("Helvetica-Bold").fontSize(11).text(b.specimenLabel, p.x - s / 2, p.y - 5, { width: s, align: "center", lineBreak: false });
  doc.restore();
}

export interface MapInput {
  lesions: ReportLesion[];
  gradeOf: (l: ReportLesion) => Grade;
  biopsies: ReportBiopsy[];
  treatments: ReportTreatment[];
}

/** Draws the map centred at (cx, cy) in page points, scaled so the face spans `diameterPt`. */
export function drawCanalMap(doc: Doc, m: MapInput, cx: number, cy: number, diameterPt: number): void {
  const scale = diameterPt / (2 * (NUMBER_RADIUS + 34));
  doc.save();
  doc.translate(cx, cy).scale(scale);
  drawFace(doc);
  // Worst grade last, so it is never hidden under a milder one.
  const order = ["benign", "condyloma", "lsil", "hsil", "suspected_cancer"] as Grade[];
  const sorted = [...m.lesions].sort((a, b) => order.indexOf(m.gradeOf(a)) - order.indexOf(m.gradeOf(b)));
  for (const l of sorted) drawLesion(doc, l, m.gradeOf(l));
  for (const t of m.treatments) drawTreatedArcs(doc, t);
  for (const b of m.biopsies) drawBiopsy(doc, b);
  doc.restore();
}

/** The legend's swatches: same pattern and outline as on the map. */
export function drawGradeSwatch(doc: Doc, grade: Grade, x: number, y: number, size: number): void {
  const d = `M ${x} ${y} h ${size} v ${size} h ${-size} Z`;
  doc.path(d).fill("#ffffff");
  fillPattern(doc, d, GRADE_ENCODING[grade].pattern, GRADE_ENCODING[grade].lines, GRADE_GREY[grade], { x, y, w: size, h: size });
  const enc = GRADE_ENCODING[grade];
  const dash = dashOf(enc.outlineDash);
  doc.save().lineWidth(Math.min(enc.outlineWidth, 2) * 0.6).strokeColor(INK);
  if (dash) doc.dash(1, { space: 2 });
  doc.path(d).stroke().restore();
}
