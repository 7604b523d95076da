import { describe, expect, it } from "vitest";
import { writeFileSync } from "node:fs";
import { PDFParse } from "pdf-parse";
import { renderVisitReport } from "./render";
import { sampleReport } from "./sample.fixture";

async function textOf(pdf: Buffer): Promise<{ text: string; pages: number }> {
  const parser = new PDFParse({ data: new Uint8Array(pdf) });
  try {
    const r = await parser.getText();
    return { text: r.text, pages: r.total };
  } finally {
    await parser.destroy();
  }
}

describe("renderVisitReport", () => {
  it("prints the findings, specimen labels, modality and dose figures", async () => {
    const pdf = await renderVisitReport(sampleReport(), "a4");
    if (process.env.DENTATE_REPORT_OUT) writeFileSync(process.env.DENTATE_REPORT_OUT, pdf);
    // A PDF file starts with the %PDF- header (ISO 32000-1 §7.5.2).
    expect(pdf.subarray(0, 5).toString("latin1")).toBe("%PDF-");
    const { text } = await textOf(pdf);
    expect(text).toContain("HSIL");
    expect(text).toContain("LSIL");
    expect(text).toContain("Infrared coagulation");
    // 1 % lidocaine × 8 mL = 80 mg: 1 % w/v = 10 mg/mL (product labels, pharmacology convention).
    expect(text).toContain("80 mg");
    // Lidocaine plain label maximum 4.5 mg/kg × 70 kg = 315 mg, capped at the 300 mg label ceiling (lidocaine product label).
    expect(text).toMatch(/300 mg maximum/);
    expect(text).toContain("DRAFT — not signed");
  });

  it("chooses the page size: A4 is 595 × 842 pt, Letter 612 × 792 pt (ISO 216; ANSI/ASME Y14.1)", async () => {
    const a4 = (await renderVisitReport(sampleReport(), "a4")).toString("latin1");
    const letter = (await renderVisitReport(sampleReport(), "letter")).toString("latin1");
    expect(a4).toMatch(/\/MediaBox \[0 0 595\.28 841\.89\]/);
    expect(letter).toMatch(/\/MediaBox \[0 0 612 792\]/);
  });

  it("prints the signature instead of the draft line once signed", async () => {
    const d = sampleReport();
    d.visit.status = "signed";
    d.visit.signedAt = "2026-03-02T10:40:00.000Z";
    d.visit.signerName = "Dr Invented Examiner";
    const { text } = await textOf(await renderVisitReport(d));
    expect(text).toContain("Signed by Dr Invented Examiner");
    expect(text).not.toContain("DRAFT — not signed");
  });
});
