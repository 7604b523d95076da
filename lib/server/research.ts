import "server-only";
// Research figures: the clinic-quality panel (IANS 2016 metrics, lib/quality) and the study
// dashboard (lib/stats), worked out from what their statements read.
import { loadQualityVisits } from "@/db/queries/research/quality";
import type { SiteScope } from "@/db/queries/scope";
import { GRADES, type Grade } from "@/lib/domain/vocab";
import { CYTOLOGY_CONFIRMATION_WINDOW_DAYS, qualityMetrics, type Metric } from "@/lib/quality";
import { readQualityFigures, saveQualityFigures } from "@/db/queries/research/stored-figures";
import { storedFigures } from "./stored-figures";
import { kaplanMeier, medianSurvival, numbersAtRisk, type SurvivalStep } from "@/lib/stats";
import { rateAt, withEmptyQuarters } from "@/lib/stats/study-figures";
import { loadStudyFigures, maxAgeSeconds, type SiteFigures } from "./study-figures";

export interface QualityGroup {
  label: string;
  metrics: Metric[];
}

export interface SiteQuality {
  siteId: string;
  siteCode: string;
  site: Metric[];
  examiners: QualityGroup[];
}

/** IANS 2016 metrics (lib/quality) for one site and calendar year; null when it had no signed visit. */
async function computeSiteQuality(siteId: string, year: number, windowDays: number): Promise<SiteQuality | null> {
  const list = await loadQualityVisits({ userId: "quality-figures", siteIds: [siteId] }, year, windowDays);
  if (!list.length) return null;
  const from = `${year}-01-01`;
  const to = `${year + 1}-01-01`;
  const examiners = new Map(list.map((v) => [v.examinerId, v.examinerName]));
  return {
    siteId,
    siteCode: list[0]!.siteCode,
    site: qualityMetrics({ visits: list, from, to }),
    examiners: [...examiners.entries()].map(([id, name]) => ({ label: name, metrics: qualityMetrics({ visits: list, from, to, examinerId: id }) })),
  };
}

// Keys are "siteId:year:windowDays"; figures are stored with their time (lib/server/stored-figures.ts).
const qualityStore = storedFigures<SiteQuality | null>("quality-figures", {
  read: async (keys) => {
    if (!keys.length) return [];
    const [, year, windowDays] = keys[0]!.split(":").map(Number) as [number, number, number];
    const rows = await readQualityFigures<SiteQuality | null>(keys.map((k) => k.split(":")[0]!), year, windowDays);
    return rows.map((r) => ({ key: `${r.siteId}:${year}:${windowDays}`, computedAt: r.computedAt, figures: r.figures }));
  },
  compute: (key) => {
    const [siteId, year, windowDays] = key.split(":") as [string, string, string];
    return computeSiteQuality(siteId, Number(year), Number(windowDays));
  },
  save: (key, at, figures) => {
    const [siteId, year, windowDays] = key.split(":") as [string, string, string];
    return saveQualityFigures(siteId, Number(year), Number(windowDays), at, figures);
  },
  maxAgeSeconds,
});

const qualityKeys = (siteIds: string[], year: number, windowDays: number) => siteIds.map((id) => `${id}:${year}:${windowDays}`);

export interface QualityPanel {
  sites: SiteQuality[];
  /** When the figures were worked out (ISO); loads over the age start a refresh. */
  asOf: string;
  refreshing: boolean;
  maxAgeMinutes: number;
}

/** IANS 2016 metrics (lib/quality) per site and per examiner at that site, for one calendar year. */
export async function loadQualityPanel(scope: SiteScope, year: number, cytologyWindowDays = CYTOLOGY_CONFIRMATION_WINDOW_DAYS): Promise<QualityPanel> {
  const { items, asOf, refreshing } = await qualityStore.load(qualityKeys(scope.siteIds, year, cytologyWindowDays));
  const sites = items.flatMap((i) => (i.figures ? [i.figures] : [])).sort((a, b) => a.siteCode.localeCompare(b.siteCode));
  return { sites, asOf: asOf.toISOString(), refreshing, maxAgeMinutes: Math.round(maxAgeSeconds() / 60) };
}

/** Works a year's quality figures out again now (what a stale load starts; scripts and tests call it). */
export function refreshQualityFigures(siteIds: string[], year: number, cytologyWindowDays = CYTOLOGY_CONFIRMATION_WINDOW_DAYS): Promise<void> {
  return qualityStore.refresh(qualityKeys(siteIds, year, cytologyWindowDays));
}

export interface RegistryDashboard {
  /** When the figures were worked out (ISO); loads after maxAgeMinutes start a refresh. */
  asOf: string;
  refreshing: boolean;
  maxAgeMinutes: number;
  patients: number;
  visits: number;
  lesions: number;
  gradeByQuarter: ({ quarter: string } & Record<Grade, number>)[];
  /** Quarters between the first and the last with no lesion at a signed visit (zero rows in gradeByQuarter). */
  emptyQuarters: string[];
  clearance: {
    lesionsTreatedFollowed: number;
    lesionsCleared: number;
    patientsTreatedFollowed: number;
    patientsCleared: number;
  };
  recurrence: { steps: SurvivalStep[]; ticks: number[]; atRisk: number[]; medianDays: number | null; patients: number; events: number; oneYear: { atRisk: number; rate: number | null } };
}

export async function loadRegistryDashboard(studyId: string, siteIds: string[]): Promise<RegistryDashboard> {
  const { sites, asOf, refreshing } = await loadStudyFigures(studyId, siteIds);
  const sum = (f: (s: SiteFigures) => number) => sites.reduce((n, s) => n + f(s), 0);
  const quarters = new Map<string, { quarter: string } & Record<Grade, number>>();
  for (const r of sites.flatMap((s) => s.grades)) {
    const row = quarters.get(r.quarter) ?? ({ quarter: r.quarter, ...Object.fromEntries(GRADES.map((g) => [g, 0])) } as { quarter: string } & Record<Grade, number>);
    row[r.grade] += r.n;
    quarters.set(r.quarter, row);
  }
  const items = sites.flatMap((s) => s.km).map(([time, event]) => ({ time, event: event === 1 }));
  const steps = kaplanMeier(items);
  const maxTime = items.reduce((m, i) => Math.max(m, i.time), 0);
  const tickStep = maxTime > 720 ? 180 : 90;
  const ticks = Array.from({ length: Math.floor(maxTime / tickStep) + 1 }, (_, i) => i * tickStep);
  const filled = withEmptyQuarters([...quarters.values()].sort((a, b) => a.quarter.localeCompare(b.quarter)), (quarter) => ({ quarter, ...Object.fromEntries(GRADES.map((g) => [g, 0])) }) as { quarter: string } & Record<Grade, number>);
  return {
    asOf: asOf.toISOString(),
    refreshing,
    maxAgeMinutes: Math.round(maxAgeSeconds() / 60),
    patients: sum((s) => s.patients),
    visits: sum((s) => s.visits),
    lesions: sum((s) => s.lesions),
    gradeByQuarter: filled.rows,
    emptyQuarters: filled.empty,
    clearance: {
      lesionsTreatedFollowed: sum((s) => s.lesionsTreatedFollowed),
      lesionsCleared: sum((s) => s.lesionsCleared),
      patientsTreatedFollowed: sum((s) => s.patientsTreatedFollowed),
      patientsCleared: sum((s) => s.patientsCleared),
    },
    recurrence: {
      steps,
      ticks,
      atRisk: numbersAtRisk(steps, ticks),
      medianDays: medianSurvival(steps),
      patients: items.length,
      events: items.filter((i) => i.event).length,
      oneYear: rateAt(steps, 365),
    },
  };
}
