import { describe, expect, it } from "vitest";
import { buildScenario } from "./scenario";

// The demo follows the day the seed runs: invented data, checked for its shape only.
describe("the demo scenario", () => {
  const runDate = new Date("2031-03-17T08:00:00Z");
  const sc = buildScenario(runDate);
  const lastVisits = sc.map((p) => p.visits.at(-1)!.date);

  it("puts every patient's last visit within about 8 months before the run date, none after it", () => {
    for (const d of lastVisits) {
      expect(d <= "2031-03-17").toBe(true);
      expect(d >= "2030-07-01").toBe(true);
    }
    expect(sc.flatMap((p) => p.visits).filter((v) => v.date.startsWith("2031")).length).toBeGreaterThan(5);
  });

  it("is the same for the same run date and moves with another", () => {
    expect(buildScenario(runDate)).toEqual(sc);
    const later = buildScenario(new Date("2031-03-27T08:00:00Z"));
    expect(later.map((p) => p.visits.at(-1)!.date)).toEqual(lastVisits.map((d) => new Date(Date.parse(`${d}T00:00:00Z`) + 10 * 86_400_000).toISOString().slice(0, 10)));
  });
});
