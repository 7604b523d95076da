import { describe, expect, it } from "vitest";
import { anaestheticSchema, gateDose, gateExtent, treatmentSchema } from "./treatments";

const lido = (pct: number, ml: number, withEpinephrine = false) => ({ agent: "lidocaine" as const, concentrationPct: pct, volumeMl: ml, withEpinephrine });
const bupi = (pct: number, ml: number, withEpinephrine = false) => ({ agent: "bupivacaine" as const, concentrationPct: pct, volumeMl: ml, withEpinephrine });

describe("gateDose: the running total of the visit decides, not the new entry alone", () => {
  it("refuses a second lidocaine entry that takes a 70 kg patient past the 300 mg plain ceiling", () => {
    // Lidocaine label: plain ≤ 4.5 mg/kg, not over 300 mg; 70 kg → 315 capped at 300 (product labels).
    // 1 % = 10 mg/mL, so 20 mL = 200 mg and 12 mL = 120 mg: neither alone is over, together 320 mg is.
    const gate = gateDose([lido(1, 20)], lido(1, 12), 70);
    expect(gate.before.agents[0]!.level).not.toBe("over");
    expect(gate.over).toBe(true);
    expect(gate.message).toContain("300 mg");
  });

  it("lets the same 320 mg through when every lidocaine entry carried epinephrine (7 mg/kg × 70 kg = 490 mg)", () => {
    // Lidocaine label with epinephrine: ≤ 7 mg/kg, not over 500 mg (product labels).
    const gate = gateDose([lido(1, 20, true)], lido(1, 12, true), 70);
    expect(gate.over).toBe(false);
  });

  it("uses the plain limit as soon as one entry of an agent had no epinephrine", () => {
    // Conservative rule of ours: the plain part is not slowed by a vasoconstrictor.
    expect(gateDose([lido(1, 20, true)], lido(1, 12, false), 70).over).toBe(true);
  });

  it("adds agents together: each under its own maximum but the combined share over 1 is refused", () => {
    // Toxicity of local anaesthetics is additive (product labels, common practice, no source).
    // Without a weight only ceilings apply: lidocaine 200/300 = 0.67, bupivacaine 0.5 % × 20 mL = 100/175 = 0.57.
    const gate = gateDose([lido(1, 20)], bupi(0.5, 20), undefined);
    expect(gate.after.agents.every((a) => a.level !== "over")).toBe(true);
    expect(gate.over).toBe(true);
  });

  it("warns (near, not over) from 80 % of the maximum", () => {
    // 0.25 % × 60 mL bupivacaine = 150 mg of the 175 mg label ceiling = 86 %; 80 % warning is common practice, no source.
    const gate = gateDose([], bupi(0.25, 60), undefined);
    expect(gate.over).toBe(false);
    expect(gate.near).toBe(true);
  });

  it("does not call exactly the ceiling over: 0.25 % × 70 mL bupivacaine = 175 mg", () => {
    // Bupivacaine label: single dose up to 175 mg without epinephrine (product labels check value).
    expect(gateDose([], bupi(0.25, 70), undefined).over).toBe(false);
  });
});

describe("gateExtent: the union of all the visit's treated arcs against the caution level", () => {
  // Staged treatment for circumferential disease (Pineda CE et al., J Gastrointest Surg 2007;11:1410-5);
  // the half-circumference level is from memory, unverified, and configurable per site.
  it("needs no reason below half the circumference, counting overlap once", () => {
    // 11→1 (2 h, across 12 o'clock) and 12→4 (4 h) overlap for 1 h: union 11→4 = 5 h = 41.7 %.
    const gate = gateExtent([{ startH: 11, endH: 1 }], [{ startH: 0, endH: 4 }], 0.5);
    expect(gate.assessment.fraction).toBeCloseTo(5 / 12, 9);
    expect(gate.needsReason).toBe(false);
  });

  it("needs a reason when a new arc takes the union to exactly half (6 of 12 hours)", () => {
    const gate = gateExtent([{ startH: 11, endH: 4 }], [{ startH: 4, endH: 5 }], 0.5);
    expect(gate.assessment.fraction).toBeCloseTo(0.5, 9);
    expect(gate.needsReason).toBe(true);
  });

  it("follows a site's stricter level (one third) and asks nothing for a treatment with no arcs", () => {
    expect(gateExtent([], [{ startH: 2, endH: 6 }], 1 / 3).needsReason).toBe(true);
    expect(gateExtent([{ startH: 2, endH: 8 }], [], 0.5).needsReason).toBe(false);
  });
});

describe("the form schemas", () => {
  it("strips a client-supplied doseMg and treatedFraction rather than trusting them", () => {
    const dose = anaestheticSchema.parse({ ...lido(1, 5), doseMg: 1 });
    expect(dose).not.toHaveProperty("doseMg");
    const t = treatmentSchema.parse({ modality: "infrared_coagulation", arcs: [{ startH: 1, endH: 2 }], treatedFraction: 0.01 });
    expect(t).not.toHaveProperty("treatedFraction");
  });

  it("asks a topical agent for its regimen and an ablation for a lesion or an arc", () => {
    const topical = treatmentSchema.safeParse({ modality: "topical_imiquimod", arcs: [] });
    expect(topical.success).toBe(false);
    expect(topical.error!.issues.map((i) => i.path.join("."))).toContain("regimen");
    const ablation = treatmentSchema.safeParse({ modality: "electrocautery", arcs: [] });
    expect(ablation.error!.issues.map((i) => i.path.join("."))).toContain("arcs");
  });
});
