import type PDFDocument from "pdfkit";
import type { Table } from "./model";

// Small layout helpers on top of pdfkit: headings, label/value lines, wrapped tables that
// break across pages and repeat their header. Standard PDF fonts only (Helvetica family).

type Doc = InstanceType<typeof PDFDocument>;
export const INK = "#1a1a1a";
export const MUTED = "#555555";
export const RULE = "#9a9a9a";

export function contentWidth(doc: Doc): number {
  return doc.page.width - doc.page.margins.left - doc.page.margins.right;
}

function bottom(doc: Doc): number {
  return doc.page.height - doc.page.margins.bottom;
}

export function ensureSpace(doc: Doc, needed: number): void {
  if (doc.y + needed > bottom(doc)) doc.addPage();
}

export function heading(doc: Doc, text: string): void {
  ensureSpace(doc, 48);
  doc.moveDown(0.6);
  const x = doc.page.margins.left;
  doc.font("Helvetica-Bold").fontSize(12).fillColor(INK).text(text, x, doc.y);
  const y = doc.y + 2;
  doc.save().lineWidth(0.8).strokeColor(INK).moveTo(x, y).lineTo(x + contentWidth(doc), y).stroke().restore();
  doc.y = y + 5;
}

export function labelValues(doc: Doc, lines: [string, string][], labelWidth = 92): void {
  const x = doc.page.margins.left;
  const w = contentWidth(doc) - labelWidth;
  for (const [label, value] of lines) {
    doc.font("Helvetica").fontSize(9.5);
    const h = Math.max(doc.heightOfString(value, { width: w }), 12);
    ensureSpace(doc, h + 2);
    const y = doc.y;
    doc.font("Helvetica-Bold").fillColor(MUTED).text(label, x, y, { width: labelWidth - 6 });
    doc.font("Helvetica").fillColor(INK).text(value, x + labelWidth, y, { width: w });
    doc.y = y + h + 2;
  }
}

export function paragraph(doc: Doc, text: string, opts: { bold?: boolean; size?: number; color?: string } = {}): void {
  doc.font(opts.bold ? "Helvetica-Bold" : "Helvetica").fontSize(opts.size ?? 9.5);
  const w = contentWidth(doc);
  ensureSpace(doc, doc.heightOfString(text, { width: w }) + 2);
  doc.fillColor(opts.color ?? INK).text(text, doc.page.margins.left, doc.y, { width: w });
  doc.moveDown(0.25);
}

export function bullets(doc: Doc, items: string[], empty: string): void {
  if (items.length === 0) return paragraph(doc, empty, { color: MUTED });
  for (const item of items) paragraph(doc, `•  ${item}`);
}

const PAD = 3;

function rowHeight(doc: Doc, cells: string[], widths: number[], bold: boolean): number {
  doc.font(bold ? "Helvetica-Bold" : "Helvetica").fontSize(bold ? 8.5 : 9);
  return Math.max(...cells.map((c, i) => doc.heightOfString(c, { width: widths[i]! - 2 * PAD }))) + 2 * PAD;
}

function drawRow(doc: Doc, cells: string[], widths: number[], bold: boolean, shade: boolean): void {
  const x0 = doc.page.margins.left;
  const h = rowHeight(doc, cells, widths, bold);
  const y = doc.y;
  const total = widths.reduce((a, b) => a + b, 0);
  if (shade) doc.save().rect(x0, y, total, h).fill("#ececec").restore();
  let x = x0;
  doc.font(bold ? "Helvetica-Bold" : "Helvetica").fontSize(bold ? 8.5 : 9).fillColor(INK);
  cells.forEach((c, i) => {
    doc.text(c, x + PAD, y + PAD, { width: widths[i]! - 2 * PAD });
    x += widths[i]!;
  });
  doc.save().lineWidth(0.5).strokeColor(RULE).moveTo(x0, y + h).lineTo(x0 + total, y + h).stroke().restore();
  doc.y = y + h;
}

export function table(doc: Doc, t: Table): void {
  if (t.rows.length === 0) return paragraph(doc, t.empty, { color: MUTED });
  const widths = t.widths.map((f) => f * contentWidth(doc));
  ensureSpace(doc, rowHeight(doc, t.columns, widths, true) + rowHeight(doc, t.rows[0]!, widths, false));
  drawRow(doc, t.columns, widths, true, true);
  for (const row of t.rows) {
    if (doc.y + rowHeight(doc, row, widths, false) > bottom(doc)) {
      doc.addPage();
      drawRow(doc, t.columns, widths, true, true);
    }
    drawRow(doc, row, widths, false, false);
  }
  doc.x = doc.page.margins.left;
  doc.moveDown(0.3);
}
