import { describe, expect, it } from "vitest";
import { PDFParse } from "pdf-parse";
import { DENTATE_RING, GRADE_ENCODING, TREATED_RING } from "@/lib/map/encoding";
import { GRADES } from "@/lib/domain/vocab";
import { renderVisitReport } from "./render";
import { sampleReport } from "./sample.fixture";

// The printed key must describe the map as the screen's legend does (both read lib/map/encoding.ts):
// a reader who learnt the screen must not meet a different code on paper.
async function keyText(): Promise<string> {
  const parser = new PDFParse({ data: new Uint8Array(await renderVisitReport(sampleReport(), "a4")) });
  try {
    return (await parser.getText()).text.replace(/\s+/g, " ");
  } finally {
    await parser.destroy();
  }
}

describe("the printed key", () => {
  it("names the dentate line and the treated arcs in the screen's words", async () => {
    const text = await keyText();
    expect(text).toContain("dash-dot ring is the dentate line");
    expect(text).toContain(TREATED_RING.words);
    expect(text).not.toMatch(/dashed ring: dentate line|dashed band/);
    expect(DENTATE_RING.words).toMatch(/^dash-dot/);
  });

  it("describes every grade's fill as the screen does", async () => {
    const text = await keyText();
    for (const g of GRADES) expect(text).toContain(GRADE_ENCODING[g].words);
  });
});
