import { describe, expect, it } from "vitest";
import { createLesionSchema, updateLesionSchema } from "./lesions";
import { gateExtent, treatedArcSchema, treatedLesions, treatmentSchema } from "./treatments";
import { DEFAULT_CAUTION_FRACTION } from "@/lib/dosing";

// The whole circumference is written 0 → 12 at the boundary; 12 o'clock is otherwise stored as 0.
// Full circle = 12 clock hours = 100 % of the circumference (geometry, 30° per hour).
const lesion = (clockStartH: number, clockEndH: number) => ({ clockStartH, clockEndH, distanceStartCm: 1, distanceEndCm: 2, grade: "hsil" });

describe("zod at the boundary: one definition of the full circle", () => {
  it("accepts a circumferential lesion and a circumferential treated arc as 0 → 12", () => {
    expect(createLesionSchema.safeParse(lesion(0, 12)).success).toBe(true);
    expect(treatedArcSchema.safeParse({ startH: 0, endH: 12 }).success).toBe(true);
    expect(treatmentSchema.safeParse({ modality: "electrocautery", arcs: [{ startH: 0, endH: 12 }] }).success).toBe(true);
  });
  it("refuses 12 as an end after any start but 0, with a field message", () => {
    const bad = createLesionSchema.safeParse(lesion(3, 12));
    expect(bad.success).toBe(false);
    expect(bad.error!.issues[0]!.path).toEqual(["clockEndH"]);
    expect(treatedArcSchema.safeParse({ startH: 3, endH: 12 }).success).toBe(false);
    expect(createLesionSchema.safeParse(lesion(12, 0)).success).toBe(false); // a start of 12 is 0
    expect(updateLesionSchema.safeParse({ version: 1, clockStartH: 6, clockEndH: 12 }).success).toBe(false);
  });
  it("keeps a treated arc that starts and ends at one hour refused (a point treats nothing)", () => {
    expect(treatedArcSchema.safeParse({ startH: 0, endH: 0 }).success).toBe(false);
  });
  it("counts 0 → 12 as 100 % in the circumference check, past the caution level", () => {
    // Caution level from half the circumference: from memory, unverified (staged treatment for
    // circumferential disease: Pineda CE et al., J Gastrointest Surg 2007).
    const gate = gateExtent([], [{ startH: 0, endH: 12 }], DEFAULT_CAUTION_FRACTION);
    expect(gate.assessment.fraction).toBe(1);
    expect(gate.needsReason).toBe(true);
  });
});

describe("treatedLesions: what a treatment entered as arcs treats", () => {
  const L = (id: string, startH: number, endH: number) => ({ id, label: id.toUpperCase(), startH, endH });
  const lesions = [L("a", 2, 4), L("b", 3, 6), L("c", 11, 1), L("d", 7, 8)];
  it("counts the named lesion and every lesion the arcs cover fully; asks about those reached in part", () => {
    const r = treatedLesions(lesions, null, [{ startH: 1.5, endH: 4.5 }]);
    expect(r.ids).toEqual(["a"]);
    expect(r.undecided.map((l) => l.id)).toEqual(["b"]);
  });
  it("takes the clinician's answer for a lesion reached in part", () => {
    expect(treatedLesions(lesions, null, [{ startH: 1.5, endH: 4.5 }], [{ lesionId: "b", treated: true }]).ids).toEqual(["a", "b"]);
    const no = treatedLesions(lesions, null, [{ startH: 1.5, endH: 4.5 }], [{ lesionId: "b", treated: false }]);
    expect(no.ids).toEqual(["a"]);
    expect(no.undecided).toEqual([]);
  });
  it("reads an arc across 12 o'clock, and the whole circumference treats every lesion", () => {
    expect(treatedLesions(lesions, null, [{ startH: 10, endH: 2 }]).ids).toEqual(["c"]);
    expect(treatedLesions(lesions, null, [{ startH: 0, endH: 12 }]).ids).toEqual(["a", "b", "c", "d"]);
  });
  it("keeps a named lesion treated whatever the arcs, and does not ask about it", () => {
    const r = treatedLesions(lesions, "b", [{ startH: 4, endH: 5 }]);
    expect(r.ids).toEqual(["b"]);
    expect(r.undecided).toEqual([]);
  });
});
