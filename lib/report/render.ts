import PDFDocument from "pdfkit";
import { GRADE_LABEL, GRADES, HISTOLOGY_AS_GRADE, type Grade } from "@/lib/domain/vocab";
import { GRADE_ENCODING, BIOPSY_TAG, ORIENTATION_NOTE, TREATED_RING } from "@/lib/map/encoding";
import { buildReportModel } from "./model";
import { drawCanalMap, drawGradeSwatch } from "./pdf-map";
import { INK, MUTED, bullets, contentWidth, heading, labelValues, paragraph, table } from "./pdf-layout";
import type { Paper, ReportLesion, VisitReportData } from "./types";

// The visit report as a PDF: vector map, findings, biopsies, treatments with doses and
// extent, cautions and overrides, addenda, signature. Greys only, standard fonts only.

const PAPER: Record<Paper, "A4" | "LETTER"> = { a4: "A4", letter: "LETTER" };
const MARGIN = 46;

function gradeForMap(d: VisitReportData): (l: ReportLesion) => Grade {
  const rank = (g: Grade) => GRADES.indexOf(g);
  const byLesion = new Map<string, Grade>();
  for (const b of d.biopsies) {
    if (!b.lesionId || !b.histology) continue;
    const g = HISTOLOGY_AS_GRADE[b.histology];
    const prev = byLesion.get(b.lesionId);
    if (!prev || rank(g) > rank(prev)) byLesion.set(b.lesionId, g);
  }
  // Histology wins for the drawn grade, as it does for tracking.
  return (l) => l.effectiveGrade ?? byLesion.get(l.id) ?? l.grade;
}

function mapAndLegend(doc: InstanceType<typeof PDFDocument>, d: VisitReportData): void {
  const x0 = MARGIN;
  const size = Math.min(300, contentWidth(doc) * 0.58);
  if (doc.y + size + 10 > doc.page.height - MARGIN) doc.addPage();
  const top = doc.y;
  drawCanalMap(doc, { lesions: d.lesions, gradeOf: gradeForMap(d), biopsies: d.biopsies, treatments: d.treatments }, x0 + size / 2, top + size / 2, size);
  let y = top + 6;
  const lx = x0 + size + 18;
  const lw = contentWidth(doc) - size - 18;
  doc.font("Helvetica-Bold").fontSize(9).fillColor(INK).text("Key", lx, y);
  y += 14;
  for (const g of GRADES) {
    drawGradeSwatch(doc, g, lx, y, 14);
    doc.font("Helvetica").fontSize(8.5).fillColor(INK).text(`${GRADE_LABEL[g]}: ${GRADE_ENCODING[g].words}`, lx + 20, y + 2, { width: lw - 20 });
    y = Math.max(doc.y, y + 16) + 3;
  }
  doc.save().lineWidth(1.6).rect(lx + 1, y, 12, 12).stroke(INK).restore();
  doc.font("Helvetica-Bold").fontSize(8).text("A", lx + 1, y + 3, { width: 12, align: "center" });
  doc.font("Helvetica").fontSize(8.5).text(`Biopsy: ${BIOPSY_TAG.words}`, lx + 20, y + 2, { width: lw - 20 });
  y = Math.max(doc.y, y + 14) + 4;
  doc.save().lineWidth(TREATED_RING.rail).rect(lx, y + 1, 14, 10).stroke(INK).restore();
  doc.save().lineWidth(8).dash(2.5, { space: 3 }).moveTo(lx, y + 6).lineTo(lx + 14, y + 6).stroke(INK).undash().restore();
  doc.text(`Treated: ${TREATED_RING.words}`, lx + 20, y + 2, { width: lw - 20 });
  y = Math.max(doc.y, y + 14) + 6;
  doc.font("Helvetica-Oblique").fontSize(8).fillColor(MUTED).text(
    `Lithotomy numbering. ${ORIENTATION_NOTE}`,
    lx, y, { width: lw },
  );
  doc.y = Math.max(doc.y, top + size) + 6;
  doc.x = MARGIN;
}

function stampPages(doc: InstanceType<typeof PDFDocument>, signed: boolean, title: string): void {
  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    const saveBottom = doc.page.margins.bottom;
    doc.page.margins.bottom = 0;
    const w = doc.page.width - 2 * MARGIN;
    doc.font("Helvetica").fontSize(7.5).fillColor(MUTED);
    doc.text(`Dentate · ${title} · page ${i - range.start + 1} of ${range.count}`, MARGIN, doc.page.height - 30, { width: w, align: "center", lineBreak: false });
    if (!signed) {
      doc.font("Helvetica-Bold").fontSize(9).fillColor(INK);
      doc.text("DRAFT — not signed", MARGIN, 22, { width: w, align: "right", lineBreak: false });
    }
    doc.page.margins.bottom = saveBottom;
  }
}

/** Renders the report; resolves with the PDF bytes. */
export function renderVisitReport(d: VisitReportData, paper: Paper = "a4"): Promise<Buffer> {
  const m = buildReportModel(d);
  const doc = new PDFDocument({
    size: PAPER[paper],
    margin: MARGIN,
    bufferPages: true,
    // No patient identifiers in the document properties: they travel in file listings.
    info: { Title: "Dentate visit report", Producer: "Dentate", Creator: "Dentate" },
  });
  const chunks: Buffer[] = [];
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on("data", (c: Buffer) => chunks.push(c));
    doc.on("end", () => resolve(Buffer.concat(chunks)));
    doc.on("error", reject);
  });

  doc.font("Helvetica-Bold").fontSize(16).fillColor(INK).text("Dentate", MARGIN, MARGIN, { continued: true });
  doc.font("Helvetica").fontSize(16).text(`  ${m.title}`);
  doc.moveDown(0.4);
  if (!m.signature.signed) paragraph(doc, m.signature.text, { bold: true, size: 10.5 });
  labelValues(doc, m.headerLines);

  heading(doc, "Canal map");
  mapAndLegend(doc, d);
  heading(doc, "Findings");
  table(doc, m.findings);
  heading(doc, "Biopsies");
  table(doc, m.biopsies);
  heading(doc, "Treatments");
  table(doc, m.treatments);
  heading(doc, "Local anaesthetic");
  table(doc, m.doses);
  heading(doc, "Cautions and overrides");
  bullets(doc, m.cautions, "No cautions were raised.");
  heading(doc, "Complications");
  bullets(doc, m.complications, "None recorded.");
  heading(doc, "Diagnoses confirmed (ICD-10-CM)");
  bullets(doc, m.diagnoses, "None confirmed.");
  heading(doc, "Plan");
  paragraph(doc, m.plan ?? "—");
  heading(doc, "Addenda");
  if (m.addenda.length === 0) paragraph(doc, "None.", { color: MUTED });
  for (const a of m.addenda) {
    paragraph(doc, a.heading, { bold: true });
    paragraph(doc, a.body);
  }
  heading(doc, "Signature");
  paragraph(doc, m.signature.text, { bold: !m.signature.signed });

  stampPages(doc, m.signature.signed, m.title);
  doc.end();
  return done;
}
