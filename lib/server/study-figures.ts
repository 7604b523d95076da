import "server-only";
// The study dashboard's figures, kept per study and site (table study_figures) so the page answers
// in milliseconds however large the registry. Each site's figures are worked out by the exports' own
// statements (db/queries/research/dashboard.ts reads the exports' CTEs and outcome definitions), so
// a figure on screen is a figure a statistician gets from the files of the same moment.
//
// Freshness: figures are shown with the time they were worked out. A load that finds them older
// than DENTATE_STUDY_FIGURES_MAX_AGE_S (default 300 s) serves them and starts a refresh in the
// background; a site with no stored figures yet is worked out before the page answers. So a change
// to a signed visit shows within that age plus one refresh of anyone's load.
import { readDashboardRows } from "@/db/queries/research/dashboard";
import { readStudyFigures, saveStudyFigures } from "@/db/queries/research/study-figures";
import type { Grade } from "@/lib/domain/vocab";

/** One site's figures: counts that add up across sites, and the survival items that concatenate. */
export interface SiteFigures {
  patients: number;
  visits: number;
  lesions: number;
  grades: { quarter: string; grade: Grade; n: number }[];
  lesionsTreatedFollowed: number;
  lesionsCleared: number;
  patientsTreatedFollowed: number;
  patientsCleared: number;
  /** Per patient in the recurrence analysis: [days from clearance to recurrence or censoring, 1 = recurred]. */
  km: [number, 0 | 1][];
}

export const maxAgeSeconds = () => Number(process.env.DENTATE_STUDY_FIGURES_MAX_AGE_S ?? 300);

export async function computeSiteFigures(studyId: string, siteId: string): Promise<SiteFigures> {
  const { totals, gradeRows, lesionClear, outcomes, patientFollow } = await readDashboardRows(studyId, [siteId]);
  return {
    ...totals,
    grades: gradeRows.map((r) => ({ quarter: r.quarter, grade: r.grade, n: r.n })),
    lesionsTreatedFollowed: lesionClear.followed,
    lesionsCleared: lesionClear.cleared,
    patientsTreatedFollowed: patientFollow.followed,
    patientsCleared: outcomes.filter((o) => o.days_treatment_to_clearance !== null).length,
    km: outcomes
      .filter((o) => o.recurrence !== null && o.days_clearance_to_recurrence_or_censor !== null)
      .map((o) => [Number(o.days_clearance_to_recurrence_or_censor), Number(o.recurrence) === 1 ? 1 : 0]),
  };
}

// One refresh per study and site at a time in this process; a second load joins the first.
const inFlight = new Map<string, Promise<void>>();

function refreshSite(studyId: string, siteId: string): Promise<void> {
  const key = `${studyId}:${siteId}`;
  const running = inFlight.get(key);
  if (running) return running;
  const started = new Date(); // figures describe the records as of the start of the reads
  const p = computeSiteFigures(studyId, siteId)
    .then((f) => saveStudyFigures(studyId, siteId, started, f))
    .finally(() => inFlight.delete(key));
  inFlight.set(key, p);
  return p;
}

/** Works the figures out again now (the refresh a stale load starts, and what scripts and tests call). */
export async function refreshStudyFigures(studyId: string, siteIds: string[]): Promise<void> {
  await Promise.all(siteIds.map((id) => refreshSite(studyId, id)));
}

/** Waits for refreshes started in the background (tests and scripts, before they close the pool). */
export async function settleStudyFigureRefreshes(): Promise<void> {
  await Promise.allSettled([...inFlight.values()]);
}

export interface StudyFigures {
  sites: SiteFigures[];
  /** The oldest of the sites' times: every figure shown is at least this recent. */
  asOf: Date;
  /** A background refresh was started by this load. */
  refreshing: boolean;
}

export async function loadStudyFigures(studyId: string, siteIds: string[], now = new Date()): Promise<StudyFigures> {
  let stored = await readStudyFigures<SiteFigures>(studyId, siteIds);
  const missing = siteIds.filter((id) => !stored.some((s) => s.siteId === id));
  if (missing.length) {
    await refreshStudyFigures(studyId, missing);
    stored = await readStudyFigures<SiteFigures>(studyId, siteIds);
  }
  const stale = stored.filter((s) => now.getTime() - s.computedAt.getTime() > maxAgeSeconds() * 1000);
  for (const s of stale) {
    refreshSite(studyId, s.siteId).catch((err: Error) => console.error("[study-figures] refresh failed:", err.message));
  }
  const asOf = stored.reduce((t, s) => (s.computedAt < t ? s.computedAt : t), now);
  return { sites: stored.map((s) => s.figures), asOf, refreshing: stale.length > 0 };
}
