import { describe, expect, it } from "vitest";
import { sectorOf, centreOf } from "@/lib/map/geometry";
import { buildReportModel } from "./model";
import { sampleReport } from "./sample.fixture";
import { clockHoursCovered } from "@/lib/fhir/terminology";
import { arcLengthH as trackingArcLengthH, compareArcs } from "@/lib/tracking";
import { hsilExtent } from "@/lib/tracking/hsil-extent";
import { assessExtent } from "@/lib/dosing";
import { describeSite } from "@/lib/geometry";

// Every reader of a stored extent agrees on the full circle written 0 → 12: 12 clock hours,
// 360°, 100 % of the circumference (geometry: 30° per hour). Before one definition the geometry
// read 0 → 12 as a point while tracking read it as a ring.
const ring = { clockStartH: 0, clockEndH: 12, distanceStartCm: 1, distanceEndCm: 2 };

describe("the full circle 0 → 12, read alike by every module", () => {
  it("the map (and the PDF, which draws lesions with the same sector) draws a whole annulus", () => {
    for (const conv of ["lithotomy", "prone_jackknife"] as const) {
      const s = sectorOf(ring, conv);
      expect(s.endAngle - s.startAngle).toBeCloseTo(2 * Math.PI, 9);
    }
    expect(centreOf(ring).storedH).toBe(6); // the label goes halfway round
  });
  it("the PDF's tables say 'the whole circumference' and 100 %", () => {
    const d = sampleReport();
    d.lesions[0] = { ...d.lesions[0]!, clockStartH: 0, clockEndH: 12 };
    d.treatments[0] = { ...d.treatments[0]!, arcs: [{ startH: 0, endH: 12 }] };
    const m = buildReportModel(d);
    expect(m.findings.rows.flat().join(" ")).toContain("the whole circumference");
    expect(m.treatments.rows[0]).toContain("the whole circumference");
    expect(m.treatments.rows[0]).toContain("100%");
    expect(describeSite(0, 12, 1, 2)).toMatch(/^the whole circumference/);
  });
  it("tracking measures 12 hours and overlaps it with any arc", () => {
    expect(trackingArcLengthH({ startH: 0, endH: 12 })).toBe(12);
    expect(compareArcs({ startH: 0, endH: 12 }, { startH: 2, endH: 4 }).overlapH).toBe(2);
    expect(hsilExtent([{ clockStartH: 0, clockEndH: 12, grade: "hsil" }]).fraction).toBe(1);
  });
  it("the circumference check reads 100 %, and the FHIR export names all twelve clock hours", () => {
    expect(assessExtent([{ startH: 0, endH: 12 }]).fraction).toBe(1);
    expect(clockHoursCovered(0, 12)).toEqual([12, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11]);
  });
});
