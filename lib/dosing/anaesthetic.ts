// Local anaesthetic arithmetic for a treatment session: how many mg were given and how
// that compares with the label maximum. This is a cross-check shown to the clinician,
// not a prescription; local protocols and the clinician decide.

import { z } from "zod";
import { ANAESTHETIC_AGENTS, type AnaestheticAgent } from "@/lib/domain/vocab";

/** X % w/v = X g / 100 mL = 10·X mg/mL (product labels). */
export function mgFromPercentAndMl(pct: number, ml: number): number {
  return pct * 10 * ml;
}

export type DoseLimit = {
  /** Per-kg maximum, when one is known. */
  mgPerKg?: number;
  /** Whether the per-kg figure is on the product label or only in secondary sources. */
  perKgSource?: "label" | "secondary";
  /** Absolute single-dose ceiling from the product label. */
  ceilingMg: number;
};

export const LABEL_LIMITS: Record<AnaestheticAgent, { plain: DoseLimit; withEpinephrine: DoseLimit }> = {
  lidocaine: {
    // Lidocaine product label: without epinephrine ≤ 4.5 mg/kg, not over 300 mg.
    plain: { mgPerKg: 4.5, perKgSource: "label", ceilingMg: 300 },
    // Lidocaine product label: with epinephrine ≤ 7 mg/kg, not over 500 mg.
    withEpinephrine: { mgPerKg: 7, perKgSource: "label", ceilingMg: 500 },
  },
  bupivacaine: {
    // Bupivacaine product label: single dose up to 175 mg without epinephrine.
    // 2.5 mg/kg: secondary sources only (the upper end of the 2–2.5 mg/kg they quote).
    plain: { mgPerKg: 2.5, perKgSource: "secondary", ceilingMg: 175 },
    // Bupivacaine product label: up to 225 mg with epinephrine 1:200,000.
    // 3 mg/kg: secondary sources only.
    withEpinephrine: { mgPerKg: 3, perKgSource: "secondary", ceilingMg: 225 },
  },
};

export type MaxDoseInput = { agent: AnaestheticAgent; withEpinephrine: boolean; weightKg?: number };
export type MaxDose = { maxMg: number; basis: "weight" | "ceiling"; explanation: string };

const AGENT_NAME: Record<AnaestheticAgent, string> = { lidocaine: "Lidocaine", bupivacaine: "Bupivacaine" };

function round1(n: number): number {
  return Math.round(n * 10) / 10;
}

/**
 * The lower of the per-kg maximum and the label ceiling. Without a weight only the
 * ceiling applies. A secondary-source per-kg figure is still applied, because taking
 * the lower number is the cautious reading.
 */
export function maxDoseMg({ agent, withEpinephrine, weightKg }: MaxDoseInput): MaxDose {
  const limit = LABEL_LIMITS[agent][withEpinephrine ? "withEpinephrine" : "plain"];
  const form = `${AGENT_NAME[agent]} ${withEpinephrine ? "with epinephrine" : "without epinephrine"}`;
  const ceilingText = `label ceiling ${limit.ceilingMg} mg`;
  if (weightKg === undefined || limit.mgPerKg === undefined) {
    const why = weightKg === undefined ? "no weight recorded" : "no per-kg figure";
    return { maxMg: limit.ceilingMg, basis: "ceiling", explanation: `${form}: ${ceilingText} (${why}).` };
  }
  const byWeightMg = limit.mgPerKg * weightKg;
  const perKgText =
    `${limit.mgPerKg} mg/kg × ${round1(weightKg)} kg = ${round1(byWeightMg)} mg` +
    (limit.perKgSource === "secondary" ? " (per-kg figure from secondary sources)" : "");
  if (byWeightMg < limit.ceilingMg) {
    return { maxMg: byWeightMg, basis: "weight", explanation: `${form}: ${perKgText}, below the ${ceilingText}.` };
  }
  return {
    maxMg: limit.ceilingMg,
    basis: "ceiling",
    explanation: `${form}: ${perKgText}, capped at the ${ceilingText}.`,
  };
}

export type DoseEntry = {
  agent: AnaestheticAgent;
  concentrationPct: number;
  volumeMl: number;
  withEpinephrine: boolean;
};

export type DoseLevel = "ok" | "near" | "over";

export type AgentDoseAssessment = {
  agent: AnaestheticAgent;
  totalMg: number;
  maxMg: number;
  fraction: number;
  level: DoseLevel;
  /** The limit used: false when any entry for this agent was plain (conservative). */
  withEpinephrineLimit: boolean;
  basis: MaxDose["basis"];
  explanation: string;
};

export type DoseAssessment = {
  agents: AgentDoseAssessment[];
  combined: { fraction: number; level: DoseLevel };
};

export type DoseOptions = {
  /** Share of the maximum from which the total is flagged "near": 0.8, common practice, no source. */
  nearFraction?: number;
};

export const DEFAULT_NEAR_FRACTION = 0.8;

/** Absorbs rounding so that exactly the maximum (e.g. 0.25 % × 70 mL bupivacaine) is not "over". */
const FRACTION_EPS = 1e-9;

function levelFor(fraction: number, nearFraction: number): DoseLevel {
  if (fraction > 1 + FRACTION_EPS) return "over";
  if (fraction >= nearFraction - FRACTION_EPS) return "near";
  return "ok";
}

/**
 * Running totals per agent against their maxima, plus the combined share.
 * - Mixed epinephrine status for one agent: the plain (lower) limit is used as soon as
 *   any entry is plain, because the plain part is not slowed by a vasoconstrictor.
 *   A conservative choice of ours.
 * - Combined fraction = Σ (agent total / agent max): local anaesthetic toxicity is
 *   treated as additive. Common practice, no source.
 */
export function assessDoses(
  entries: readonly DoseEntry[],
  weightKg?: number,
  options: DoseOptions = {},
): DoseAssessment {
  const nearFraction = options.nearFraction ?? DEFAULT_NEAR_FRACTION;
  if (!(nearFraction > 0 && nearFraction <= 1)) throw new RangeError("nearFraction must be in (0, 1]");
  const agents: AgentDoseAssessment[] = [];
  for (const agent of ANAESTHETIC_AGENTS) {
    const mine = entries.filter((e) => e.agent === agent);
    if (mine.length === 0) continue;
    const totalMg = mine.reduce((sum, e) => sum + mgFromPercentAndMl(e.concentrationPct, e.volumeMl), 0);
    const withEpinephrineLimit = mine.every((e) => e.withEpinephrine);
    const max = maxDoseMg({ agent, withEpinephrine: withEpinephrineLimit, weightKg });
    const fraction = totalMg / max.maxMg;
    agents.push({
      agent,
      totalMg,
      maxMg: max.maxMg,
      fraction,
      level: levelFor(fraction, nearFraction),
      withEpinephrineLimit,
      basis: max.basis,
      explanation: max.explanation,
    });
  }
  const combinedFraction = agents.reduce((sum, a) => sum + a.fraction, 0);
  return { agents, combined: { fraction: combinedFraction, level: levelFor(combinedFraction, nearFraction) } };
}

export const doseEntrySchema = z.object({
  agent: z.enum(ANAESTHETIC_AGENTS, { error: "Choose lidocaine or bupivacaine." }),
  concentrationPct: z
    .number({ error: "Enter the concentration in %." })
    .min(0.1, { error: "Concentration must be at least 0.1 %." })
    .max(5, { error: "Concentration must be at most 5 %." }),
  volumeMl: z
    .number({ error: "Enter the volume in mL." })
    .min(0, { error: "Volume cannot be negative." })
    .max(100, { error: "Volume must be at most 100 mL." }),
  withEpinephrine: z.boolean({ error: "Say whether the solution contained epinephrine." }),
});

export const weightKgSchema = z
  .number({ error: "Enter the weight in kg." })
  .min(20, { error: "Weight must be at least 20 kg." })
  .max(300, { error: "Weight must be at most 300 kg." });

/** A session's injections and the patient's weight (optional: without it only ceilings apply). */
export const doseSessionSchema = z.object({
  entries: z.array(doseEntrySchema),
  weightKg: weightKgSchema.optional(),
});

/**
 * Most an agent may total in any 24 hours, across sessions and visits, where the label gives one.
 * Bupivacaine: the US product label (bupivacaine hydrochloride injection, e.g. Marcaine) says a total
 * daily dose of 400 mg should not be exceeded; from memory, confirm against the label in local use.
 * Lidocaine's label gives single-dose maxima only, so none is set here.
 */
export const DAILY_LIMIT_MG: Partial<Record<AnaestheticAgent, number>> = { bupivacaine: 400 };

export type DailyTotal = { agent: AnaestheticAgent; earlierMg: number; totalMg: number; limitMg: number; over: boolean };

/**
 * Per agent with a daily limit: what was given to the patient in the 24 hours before (other
 * sessions) plus this session's entries, against the limit.
 */
export function dailyTotals(earlierWithin24h: readonly DoseEntry[], session: readonly DoseEntry[]): DailyTotal[] {
  const out: DailyTotal[] = [];
  for (const agent of ANAESTHETIC_AGENTS) {
    const limitMg = DAILY_LIMIT_MG[agent];
    if (limitMg === undefined) continue;
    const sum = (xs: readonly DoseEntry[]) =>
      xs.filter((e) => e.agent === agent).reduce((t, e) => t + mgFromPercentAndMl(e.concentrationPct, e.volumeMl), 0);
    const earlierMg = sum(earlierWithin24h);
    const totalMg = earlierMg + sum(session);
    if (totalMg === 0) continue;
    out.push({ agent, earlierMg, totalMg, limitMg, over: totalMg > limitMg + FRACTION_EPS });
  }
  return out;
}
