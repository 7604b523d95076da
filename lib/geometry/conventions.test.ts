import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { POSITIONS } from "@/lib/domain/vocab";
import {
  CARDINAL_DISPLAY_HOURS,
  anatomicalLabelAt,
  describeSite,
  fromDisplayHours,
  sectorName,
  toDisplayHours,
  type DisplayConvention,
} from "./conventions";

// Classic primary haemorrhoid positions 3, 7, 11 o'clock in lithotomy (standard surgical texts;
// surgical anatomy texts).
const HAEMORRHOID_POSITIONS_LITHOTOMY = [3, 7, 11];

describe("toDisplayHours / fromDisplayHours", () => {
  it("keeps lithotomy numbers as stored", () => {
    for (const h of HAEMORRHOID_POSITIONS_LITHOTOMY) expect(toDisplayHours(h, "lithotomy")).toBe(h);
  });
  // Prone jack-knife: the haemorrhoid positions read 1, 5 and 9 o'clock (surgical anatomy texts: derived, from memory).
  it("reads the haemorrhoid positions as {1, 5, 9} in prone jack-knife", () => {
    const shown = new Set(HAEMORRHOID_POSITIONS_LITHOTOMY.map((h) => toDisplayHours(h, "prone_jackknife")));
    expect(shown).toEqual(new Set([1, 5, 9]));
  });
  // Prone jack-knife: 12 o'clock posterior, 6 anterior (surgical anatomy texts: derived, from memory).
  it("puts posterior at 12 in prone jack-knife", () => {
    expect(fromDisplayHours(12, "prone_jackknife")).toBe(6);
    expect(fromDisplayHours(6, "prone_jackknife")).toBe(0);
  });
  // Left lateral: no published convention; lithotomy numbering kept (surgical anatomy texts).
  it("keeps lithotomy numbers in left lateral", () => {
    expect(toDisplayHours(7, "left_lateral")).toBe(7);
    expect(fromDisplayHours(11, "left_lateral")).toBe(11);
  });
  it("round-trips in every convention (property)", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 11.999999, noNaN: true }),
        fc.constantFrom(...POSITIONS),
        (storedH, conv: DisplayConvention) => {
          expect(fromDisplayHours(toDisplayHours(storedH, conv), conv)).toBeCloseTo(storedH, 9);
          expect(toDisplayHours(fromDisplayHours(storedH, conv), conv)).toBeCloseTo(storedH, 9);
        },
      ),
    );
  });
});

describe("anatomicalLabelAt", () => {
  // Lithotomy: 12 anterior, 6 posterior, 3 patient's left, 9 patient's right (surgical anatomy texts).
  it("labels the lithotomy cardinals", () => {
    expect(anatomicalLabelAt(12, "lithotomy")).toBe("Anterior");
    expect(anatomicalLabelAt(0, "lithotomy")).toBe("Anterior");
    expect(anatomicalLabelAt(3, "lithotomy")).toBe("Patient's left");
    expect(anatomicalLabelAt(6, "lithotomy")).toBe("Posterior");
    expect(anatomicalLabelAt(9, "lithotomy")).toBe("Patient's right");
  });
  // Prone jack-knife: 12 posterior, 6 anterior, 3 patient's right, 9 patient's left
  // (surgical anatomy texts: derived, from memory).
  it("labels the prone jack-knife cardinals", () => {
    expect(anatomicalLabelAt(12, "prone_jackknife")).toBe("Posterior");
    expect(anatomicalLabelAt(3, "prone_jackknife")).toBe("Patient's right");
    expect(anatomicalLabelAt(6, "prone_jackknife")).toBe("Anterior");
    expect(anatomicalLabelAt(9, "prone_jackknife")).toBe("Patient's left");
  });
  it("gives four different labels in every convention and none between cardinals", () => {
    for (const conv of POSITIONS) {
      const labels = CARDINAL_DISPLAY_HOURS.map((h) => anatomicalLabelAt(h, conv));
      expect(new Set(labels).size).toBe(4);
      expect(anatomicalLabelAt(1, conv)).toBeNull();
      expect(anatomicalLabelAt(4.5, conv)).toBeNull();
    }
  });
});

describe("sectorName", () => {
  // 3, 7, 11 in lithotomy = left lateral, right posterior, right anterior (standard surgical texts; surgical anatomy texts).
  it("names the haemorrhoid positions", () => {
    expect(sectorName(3)).toBe("left lateral");
    expect(sectorName(7)).toBe("right posterior");
    expect(sectorName(11)).toBe("right anterior");
  });
  // Anal fissures sit mostly at 6 o'clock = posterior midline in lithotomy (surgical anatomy texts).
  it("names 6 o'clock posterior and 12 anterior", () => {
    expect(sectorName(6)).toBe("posterior");
    expect(sectorName(0)).toBe("anterior");
    expect(sectorName(9)).toBe("right lateral");
  });
  it("uses 1.5 h sectors centred on the eight directions", () => {
    expect(sectorName(11.3)).toBe("anterior");
    expect(sectorName(0.7)).toBe("anterior");
    expect(sectorName(0.8)).toBe("left anterior");
    expect(sectorName(4.5)).toBe("left posterior");
    expect(sectorName(10.5)).toBe("right anterior");
  });
});

describe("describeSite", () => {
  it("describes a canal site with numbers and anatomical words", () => {
    expect(describeSite(1, 3, 1, 2)).toBe("1 to 3 o'clock (left anterior to left lateral), 1–2 cm from the verge");
  });
  it("describes perianal skin outside the verge", () => {
    expect(describeSite(6, 6, 0, -2)).toBe("6 o'clock (posterior), perianal skin, 0–2 cm outside the verge");
  });
  it("describes a site straddling the verge and one at a single depth", () => {
    expect(describeSite(11, 1, -1, 2.5)).toBe(
      "11 to 1 o'clock (right anterior to left anterior), from 1 cm outside to 2.5 cm inside the verge",
    );
    expect(describeSite(3.5, 3.5, 2, 2)).toBe("3:30 (left lateral), 2 cm from the verge");
  });
  // The anatomical words do not change with the position; the numbers do (surgical anatomy texts).
  it("shows prone jack-knife numbers with the same anatomy", () => {
    expect(describeSite(3, 3, 1, 1, "prone_jackknife")).toBe("9 o'clock (left lateral), 1 cm from the verge");
  });
});
