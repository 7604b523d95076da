// Kaplan–Meier product-limit estimate with Greenwood's standard error.
// Ties: events at a time are counted before censorings at the same time, so a case censored at t
// is still at risk at t (the usual convention, as in Kleinbaum & Klein, Survival Analysis).

export interface SurvivalItem {
  /** Time from the start of follow-up, in whatever unit the caller uses (days, weeks...). */
  time: number;
  /** true = the event happened at `time`; false = censored (follow-up ended without it). */
  event: boolean;
}

export interface SurvivalStep {
  time: number;
  /** Cases with time >= this step's time. */
  atRisk: number;
  events: number;
  /** Cases censored from this step's time up to (not including) the next step's time. */
  censored: number;
  /** The censoring times counted in `censored`, ascending; lets numbers at risk be read anywhere. */
  censoredTimes: number[];
  survival: number;
  /** Greenwood: S(t) · sqrt(Σ d / (n (n − d))). NaN once survival reaches 0 with n = d. */
  standardError: number;
}

/**
 * One step at time 0 (the baseline row of a life table: survival 1 unless events happen at 0)
 * and one at each distinct event time after 0. Empty input gives no steps.
 */
export function kaplanMeier(items: readonly SurvivalItem[]): SurvivalStep[] {
  for (const it of items) {
    if (!Number.isFinite(it.time) || it.time < 0) throw new RangeError(`kaplanMeier: bad time ${it.time}`);
  }
  if (items.length === 0) return [];
  const sorted = [...items].sort((a, b) => a.time - b.time || Number(b.event) - Number(a.event));
  const eventTimes = [...new Set(sorted.filter((i) => i.event && i.time > 0).map((i) => i.time))];
  const stepTimes = [0, ...eventTimes];

  // One sweep over the sorted items (a registry has tens of thousands): at each step time t the
  // items before index p ended earlier, so n − p are at risk; the items up to the next step time
  // are this step's events (at t) and censorings.
  const steps: SurvivalStep[] = [];
  const n = sorted.length;
  let survival = 1;
  let greenwoodSum = 0;
  let p = 0;
  for (let k = 0; k < stepTimes.length; k++) {
    const t = stepTimes[k];
    const next = k + 1 < stepTimes.length ? stepTimes[k + 1] : Infinity;
    while (p < n && sorted[p].time < t) p++;
    const atRisk = n - p;
    let events = 0;
    const censoredTimes: number[] = [];
    for (; p < n && sorted[p].time < next; p++) {
      if (!sorted[p].event) censoredTimes.push(sorted[p].time);
      else if (sorted[p].time === t) events++;
    }
    if (events > 0) {
      survival *= (atRisk - events) / atRisk;
      greenwoodSum += atRisk > events ? events / (atRisk * (atRisk - events)) : NaN;
    }
    steps.push({
      time: t,
      atRisk,
      events,
      censored: censoredTimes.length,
      censoredTimes,
      survival,
      standardError: survival * Math.sqrt(greenwoodSum),
    });
  }
  return steps;
}

/** Survival at any time t: the value of the last step at or before t (a right-continuous step). */
export function survivalAt(steps: readonly SurvivalStep[], t: number): number {
  let s = 1;
  for (const step of steps) {
    if (step.time > t) break;
    s = step.survival;
  }
  return s;
}

/** Numbers still at risk (time >= t) at each requested time, for the ticks under a chart. */
export function numbersAtRisk(steps: readonly SurvivalStep[], times: readonly number[]): number[] {
  if (steps.length === 0) return times.map(() => 0);
  return times.map((t) => {
    if (t <= steps[0].time) return steps[0].atRisk;
    let step = steps[0];
    for (const s of steps) if (s.time <= t) step = s;
    const leftAtStep = step.time < t ? step.events : 0;
    return step.atRisk - leftAtStep - step.censoredTimes.filter((c) => c < t).length;
  });
}

/**
 * Median survival: the earliest step time where survival falls to 0.5 or below; null when the
 * curve never gets there (the median is then not reached, as reported in trials).
 */
export function medianSurvival(steps: readonly SurvivalStep[]): number | null {
  return steps.find((s) => s.survival <= 0.5)?.time ?? null;
}
