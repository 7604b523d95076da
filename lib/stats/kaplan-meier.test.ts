import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { kaplanMeier, medianSurvival, numbersAtRisk, survivalAt } from "./kaplan-meier";

// 6-mercaptopurine arm of the leukaemia remission trial (Freireich EJ et al., Blood 1963; the data
// set used by Gehan 1965 and tabulated in Kleinbaum & Klein, Survival Analysis: A Self-Learning
// Text). Remission weeks, false = censored. Data as in Freireich 1963; Kleinbaum & Klein: recalled from
// memory there and recomputed by hand; the estimates below are those published values.
const sixMp = [
  [6, true], [6, true], [6, true], [6, false], [7, true], [9, false], [10, true], [10, false],
  [11, false], [13, true], [16, true], [17, false], [19, false], [20, false], [22, true], [23, true],
  [25, false], [32, false], [32, false], [34, false], [35, false],
].map(([time, event]) => ({ time: time as number, event: event as boolean }));

describe("kaplanMeier on the 6-MP remission data", () => {
  const steps = kaplanMeier(sixMp);
  const at = (t: number) => steps.find((s) => s.time === t)!;

  // Kleinbaum & Klein / Freireich 1963; Kleinbaum & Klein: S(t) and numbers at risk at each event time.
  const published: [number, number, number][] = [
    [6, 0.857, 21],
    [7, 0.807, 17],
    [10, 0.753, 15],
    [13, 0.69, 12],
    [16, 0.627, 11],
    [22, 0.538, 7],
    [23, 0.448, 6],
  ];
  it.each(published)("S(%d) = %d with %d at risk", (t, survival, atRisk) => {
    expect(at(t).survival).toBeCloseTo(survival, 3);
    expect(at(t).atRisk).toBe(atRisk);
  });

  it("steps only at event times after the time-0 baseline", () => {
    expect(steps.map((s) => s.time)).toEqual([0, 6, 7, 10, 13, 16, 22, 23]);
    expect(steps[0]).toMatchObject({ atRisk: 21, events: 0, survival: 1 });
  });

  // Events per time and censorings in [t_j, t_j+1) counted by hand from the data above; the same
  // layout as the life table in Kleinbaum & Klein (recalled from memory).
  it("counts events and censorings between event times", () => {
    expect(steps.map((s) => s.events)).toEqual([0, 3, 1, 1, 1, 1, 1, 1]);
    expect(steps.map((s) => s.censored)).toEqual([0, 1, 1, 2, 0, 3, 0, 5]);
  });

  // Greenwood standard errors: recalled from memory (R survival output for this data set, 0.0764 …
  // 0.1346) and recomputed independently from S·sqrt(Σ d/(n(n−d))).
  it("gives Greenwood standard errors", () => {
    const expected = [0.0764, 0.0869, 0.0963, 0.1068, 0.1141, 0.1282, 0.1346];
    expect(steps.slice(1).map((s) => s.standardError)).toEqual(expected.map((e) => expect.closeTo(e, 4)));
  });

  // S(22) = 0.538 > 0.5 and S(23) = 0.448 ≤ 0.5 (Freireich 1963; Kleinbaum & Klein), so the median is 23 weeks,
  // the figure Kleinbaum & Klein give for this group (from memory).
  it("has median remission 23 weeks", () => {
    expect(medianSurvival(steps)).toBe(23);
  });

  // Counted by hand from the data: cases with time ≥ t.
  it("reads numbers at risk at chart ticks between event times", () => {
    expect(numbersAtRisk(steps, [0, 5, 6, 8, 10, 20, 30, 40])).toEqual([21, 21, 21, 16, 15, 8, 4, 0]);
  });

  it("holds survival flat between event times", () => {
    expect(survivalAt(steps, 5)).toBe(1);
    expect(survivalAt(steps, 15)).toBeCloseTo(0.69, 3); // S(13) carried to week 15, Freireich 1963; Kleinbaum & Klein
  });
});

describe("kaplanMeier edge cases", () => {
  // Placebo arm of the same trial, no censoring (Kleinbaum & Klein group 2, from memory): with no
  // censoring KM equals the plain proportion still in remission, 8/21 after week 8; median 8 weeks.
  const placebo = [1, 1, 2, 2, 3, 4, 4, 5, 5, 8, 8, 8, 8, 11, 11, 12, 12, 15, 17, 22, 23].map((time) => ({
    time,
    event: true,
  }));
  it("equals the empirical proportion without censoring", () => {
    const steps = kaplanMeier(placebo);
    expect(survivalAt(steps, 8)).toBeCloseTo(8 / 21, 10);
    expect(medianSurvival(steps)).toBe(8);
    expect(steps[steps.length - 1].survival).toBe(0);
  });

  it("returns no median when the curve stays above one half", () => {
    expect(medianSurvival(kaplanMeier([{ time: 3, event: true }, { time: 5, event: false }, { time: 6, event: false }]))).toBeNull();
  });

  it("refuses negative or non-finite times", () => {
    expect(() => kaplanMeier([{ time: -1, event: true }])).toThrow(RangeError);
    expect(() => kaplanMeier([{ time: Number.NaN, event: false }])).toThrow(RangeError);
  });

  it("counts a case censored at an event time as still at risk there (events first)", () => {
    // Convention as stated in Kleinbaum & Klein (from memory): 2 at risk at t = 4, one event → 1/2.
    const steps = kaplanMeier([{ time: 4, event: true }, { time: 4, event: false }]);
    expect(steps[1]).toMatchObject({ time: 4, atRisk: 2, events: 1, censored: 1, survival: 0.5 });
  });
});

describe("kaplanMeier on many cases", () => {
  // The product-limit definition read literally (Kaplan & Meier, JASA 1958): at each distinct event
  // time t, n = cases with time >= t, d = events at t, S = Π (n − d) / n. The sweep must agree with
  // it on any input, ties of events and censorings at one time included.
  const literal = (items: { time: number; event: boolean }[]) => {
    const times = [...new Set(items.filter((i) => i.event && i.time > 0).map((i) => i.time))].sort((a, b) => a - b);
    let s = 1;
    return [0, ...times].map((t, k, all) => {
      const n = items.filter((i) => i.time >= t).length;
      const d = items.filter((i) => i.event && i.time === t).length;
      if (d) s *= (n - d) / n;
      const next = all[k + 1] ?? Infinity;
      return { time: t, atRisk: n, events: d, censored: items.filter((i) => !i.event && i.time >= t && i.time < next).length, survival: s };
    });
  };
  it("agrees with the definition read literally, step by step", () => {
    fc.assert(
      fc.property(fc.array(fc.record({ time: fc.integer({ min: 0, max: 40 }), event: fc.boolean() }), { minLength: 1, maxLength: 60 }), (items) => {
        const got = kaplanMeier(items).map(({ time, atRisk, events, censored, survival }) => ({ time, atRisk, events, censored, survival }));
        const want = literal(items);
        expect(got.length).toBe(want.length);
        got.forEach((g, i) => {
          expect({ ...g, survival: 0 }).toEqual({ ...want[i]!, survival: 0 });
          expect(g.survival).toBeCloseTo(want[i]!.survival, 12);
        });
      }),
      { numRuns: 300 },
    );
  });
});
