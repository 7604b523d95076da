import { numbersAtRisk, survivalAt, type SurvivalStep } from "./kaplan-meier";

/**
 * Fewest patients still followed at a time point for the study page to print a survival rate
 * there. A Kaplan–Meier rate resting on a handful of patients swings by whole tens of percent
 * with one event; below this count the page shows the number at risk and no rate. A local
 * default (common practice, no single source).
 */
export const MIN_AT_RISK_FOR_RATE = 10;

/** The survival rate at day `t` with the number still at risk there; no rate when too few remain. */
export function rateAt(steps: readonly SurvivalStep[], t: number, minAtRisk = MIN_AT_RISK_FOR_RATE): { atRisk: number; rate: number | null } {
  const [atRisk] = numbersAtRisk(steps, [t]) as [number];
  return { atRisk, rate: atRisk >= minAtRisk ? survivalAt(steps, t) : null };
}

/**
 * Every quarter from the first to the last with data, the empty ones included as zero rows, and
 * the list of those empty quarters, so a chart never closes a gap without saying so.
 * Quarters are written "2025 Q3" (PostgreSQL to_char 'YYYY "Q"Q').
 */
export function withEmptyQuarters<R extends { quarter: string }>(rows: readonly R[], zero: (quarter: string) => R): { rows: R[]; empty: string[] } {
  const parse = (q: string) => /^(\d{4}) Q([1-4])$/.exec(q);
  const known = rows.map((r) => parse(r.quarter));
  if (rows.length === 0 || known.some((k) => !k)) return { rows: [...rows], empty: [] };
  const index = (k: RegExpExecArray) => Number(k[1]) * 4 + Number(k[2]) - 1;
  const byIndex = new Map(rows.map((r, i) => [index(known[i]!), r]));
  const first = Math.min(...byIndex.keys());
  const last = Math.max(...byIndex.keys());
  const out: R[] = [];
  const empty: string[] = [];
  for (let i = first; i <= last; i++) {
    const row = byIndex.get(i);
    if (row) out.push(row);
    else {
      const q = `${Math.floor(i / 4)} Q${(i % 4) + 1}`;
      empty.push(q);
      out.push(zero(q));
    }
  }
  return { rows: out, empty };
}
