import { describe, expect, it } from "vitest";
import fc from "fast-check";
import {
  assessDoses,
  doseEntrySchema,
  doseSessionSchema,
  maxDoseMg,
  mgFromPercentAndMl,
  weightKgSchema,
  type DoseEntry,
} from "./anaesthetic";

const entry = (
  agent: DoseEntry["agent"],
  concentrationPct: number,
  volumeMl: number,
  withEpinephrine = false,
): DoseEntry => ({ agent, concentrationPct, volumeMl, withEpinephrine });

describe("mgFromPercentAndMl", () => {
  // X % = 10·X mg/mL: 1 % = 1 g/100 mL = 10 mg/mL; 0.5 % = 5 mg/mL; 0.25 % = 2.5 mg/mL (product labels).
  it("converts per cent w/v to mg", () => {
    expect(mgFromPercentAndMl(1, 1)).toBe(10);
    expect(mgFromPercentAndMl(0.5, 1)).toBe(5);
    expect(mgFromPercentAndMl(0.25, 1)).toBe(2.5);
  });
  // Bupivacaine label check value: 0.25 % × 70 mL = 175 mg (product labels).
  it("gives 175 mg for 70 mL of 0.25 %", () => {
    expect(mgFromPercentAndMl(0.25, 70)).toBe(175);
  });
});

describe("maxDoseMg", () => {
  // Lidocaine label: plain ≤ 4.5 mg/kg, not over 300 mg. 70 kg → 315 mg, capped at 300 mg (product labels).
  it("caps plain lidocaine for 70 kg at 300 mg", () => {
    const max = maxDoseMg({ agent: "lidocaine", withEpinephrine: false, weightKg: 70 });
    expect(max.maxMg).toBe(300);
    expect(max.basis).toBe("ceiling");
    expect(max.explanation).toContain("315 mg");
  });
  // Lidocaine label: with epinephrine ≤ 7 mg/kg, not over 500 mg. 70 kg → 490 mg (product labels).
  it("gives 490 mg of lidocaine with epinephrine for 70 kg", () => {
    const max = maxDoseMg({ agent: "lidocaine", withEpinephrine: true, weightKg: 70 });
    expect(max.maxMg).toBe(490);
    expect(max.basis).toBe("weight");
  });
  // Lidocaine label, 50 kg plain: 4.5 × 50 = 225 mg, below the 300 mg ceiling (worked by hand).
  it("uses the per-kg figure when it is below the ceiling", () => {
    expect(maxDoseMg({ agent: "lidocaine", withEpinephrine: false, weightKg: 50 }).maxMg).toBe(225);
  });
  // Bupivacaine label: 175 mg plain, 225 mg with epinephrine 1:200,000 (product labels).
  it("falls back to the bupivacaine label ceilings without a weight", () => {
    expect(maxDoseMg({ agent: "bupivacaine", withEpinephrine: false }).maxMg).toBe(175);
    const withEpi = maxDoseMg({ agent: "bupivacaine", withEpinephrine: true });
    expect(withEpi.maxMg).toBe(225);
    expect(withEpi.basis).toBe("ceiling");
  });
  // Bupivacaine 2.5 mg/kg plain: secondary sources (product labels). 40 kg → 100 mg, below 175 mg.
  it("applies the secondary-source per-kg bupivacaine figure for a small patient and says so", () => {
    const max = maxDoseMg({ agent: "bupivacaine", withEpinephrine: false, weightKg: 40 });
    expect(max.maxMg).toBe(100);
    expect(max.explanation).toMatch(/secondary/);
  });
  it("never exceeds the label ceiling, whatever the weight (property)", () => {
    fc.assert(
      fc.property(
        fc.constantFrom("lidocaine" as const, "bupivacaine" as const),
        fc.boolean(),
        fc.double({ min: 20, max: 300, noNaN: true }),
        (agent, withEpinephrine, weightKg) => {
          const withWeight = maxDoseMg({ agent, withEpinephrine, weightKg }).maxMg;
          return withWeight <= maxDoseMg({ agent, withEpinephrine }).maxMg;
        },
      ),
    );
  });
});

describe("assessDoses", () => {
  // 2 % lidocaine 20 mL = 400 mg; plain limit for 70 kg is 300 mg (lidocaine label, product labels).
  it("flags 400 mg of plain lidocaine in a 70 kg patient as over", () => {
    const result = assessDoses([entry("lidocaine", 2, 20)], 70);
    expect(result.agents).toHaveLength(1);
    expect(result.agents[0].totalMg).toBe(400);
    expect(result.agents[0].maxMg).toBe(300);
    expect(result.agents[0].level).toBe("over");
    expect(result.combined.level).toBe("over");
  });
  // Same 400 mg with epinephrine: limit 490 mg for 70 kg (lidocaine label) → 82 % ≥ 80 % "near"
  // (the 80 % threshold is common practice, no source).
  it("calls 400 mg of lidocaine with epinephrine in 70 kg near, not over", () => {
    const [lido] = assessDoses([entry("lidocaine", 2, 20, true)], 70).agents;
    expect(lido.maxMg).toBe(490);
    expect(lido.level).toBe("near");
  });
  // Bupivacaine 0.25 % × 70 mL = 175 mg = the plain label ceiling: at the limit, not over.
  it("treats exactly the label ceiling as near, not over", () => {
    const [bupi] = assessDoses([entry("bupivacaine", 0.25, 70)], 70).agents;
    expect(bupi.fraction).toBe(1);
    expect(bupi.level).toBe("near");
  });
  it("uses the plain limit when any entry for an agent is plain (conservative choice, ours)", () => {
    const [lido] = assessDoses([entry("lidocaine", 1, 10, true), entry("lidocaine", 1, 5, false)], 70).agents;
    expect(lido.totalMg).toBe(150);
    expect(lido.maxMg).toBe(300); // plain lidocaine, 70 kg (label)
    expect(lido.withEpinephrineLimit).toBe(false);
  });
  // Additive toxicity (common practice, no source): 1 % lidocaine 15 mL = 150 mg of 300 mg (0.5)
  // plus 0.5 % bupivacaine 10 mL = 50 mg of 175 mg (≈ 0.286) → ≈ 0.786, below 80 %; adding
  // 2 mL more bupivacaine (10 mg) → 60/175 ≈ 0.343, total ≈ 0.843 → near.
  it("adds the agents' shares of their own maxima", () => {
    const base = [entry("lidocaine", 1, 15), entry("bupivacaine", 0.5, 10)];
    const first = assessDoses(base, 70);
    expect(first.combined.fraction).toBeCloseTo(0.5 + 50 / 175, 9);
    expect(first.combined.level).toBe("ok");
    expect(first.agents.every((a) => a.level === "ok")).toBe(true);
    const more = assessDoses([...base, entry("bupivacaine", 0.5, 2)], 70);
    expect(more.combined.fraction).toBeCloseTo(0.5 + 60 / 175, 9);
    expect(more.combined.level).toBe("near");
  });
  it("flags a combination over 100 % even when each agent alone is under its limit", () => {
    // 1 % lidocaine 20 mL = 200 mg of 300 (0.667) + 0.5 % bupivacaine 14 mL = 70 mg of 175 (0.4) → 1.067.
    const result = assessDoses([entry("lidocaine", 1, 20), entry("bupivacaine", 0.5, 14)], 70);
    expect(result.agents.map((a) => a.level)).not.toContain("over");
    expect(result.combined.level).toBe("over");
  });
  it("honours a configured near threshold and returns nothing for no entries", () => {
    // 1 % lidocaine 20 mL = 200 mg of 300 mg = 0.667.
    expect(assessDoses([entry("lidocaine", 1, 20)], 70, { nearFraction: 0.6 }).agents[0].level).toBe("near");
    expect(assessDoses([entry("lidocaine", 1, 20)], 70).agents[0].level).toBe("ok");
    expect(assessDoses([], 70)).toEqual({ agents: [], combined: { fraction: 0, level: "ok" } });
    expect(() => assessDoses([], 70, { nearFraction: 0 })).toThrow(RangeError);
  });
});

describe("validation schemas", () => {
  it("accepts a typical office dose", () => {
    expect(doseEntrySchema.safeParse(entry("bupivacaine", 0.5, 5)).success).toBe(true);
    expect(doseSessionSchema.safeParse({ entries: [entry("lidocaine", 1, 5)] }).success).toBe(true);
  });
  it("rejects out-of-range concentration and volume with field messages", () => {
    const result = doseEntrySchema.safeParse(entry("lidocaine", 10, 150));
    expect(result.success).toBe(false);
    if (!result.success) {
      const byField = Object.fromEntries(result.error.issues.map((i) => [i.path.join("."), i.message]));
      expect(byField.concentrationPct).toMatch(/at most 5 %/);
      expect(byField.volumeMl).toMatch(/at most 100 mL/);
    }
  });
  it("rejects an unknown agent and a weight outside 20–300 kg", () => {
    expect(doseEntrySchema.safeParse({ ...entry("lidocaine", 1, 1), agent: "cocaine" }).success).toBe(false);
    expect(weightKgSchema.safeParse(15).success).toBe(false);
    expect(weightKgSchema.safeParse(301).success).toBe(false);
    expect(weightKgSchema.safeParse(70).success).toBe(true);
  });
});
