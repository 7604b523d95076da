import { describe, expect, it } from "vitest";
import { nextTrackLabel, trackLabel } from "./track-label";

// AJCC Cancer Staging Manual 8th ed., anus chapter: primary tumour categories TX, T0, Tis, T1–T4
// (with letter suffixes such as T4a elsewhere in the manual).
const TNM_T = /^T(X|0|is|[1-4][a-d]?)$/i;
// Biopsy specimens are labelled with one capital letter per visit (db/schema/clinical.ts specimen_label).
const SPECIMEN = /^[A-Z]$/;

describe("track labels", () => {
  it("never read as a TNM tumour category, a specimen letter or a clock number", () => {
    for (let n = 1; n <= 40; n++) {
      const label = trackLabel(n);
      expect(label).not.toMatch(TNM_T);
      expect(label).not.toMatch(SPECIMEN);
      expect(label).not.toMatch(/^(1[0-2]|[1-9])$/);
    }
  });
  it("continues after the highest label, ignoring gaps and labels of another form", () => {
    expect(nextTrackLabel([])).toBe("#1");
    expect(nextTrackLabel(["#1", "#3", "legacy"])).toBe("#4");
    expect(nextTrackLabel(["#9", "#10"])).toBe("#11");
  });
});
