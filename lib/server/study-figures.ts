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
import { readStudyFigures, saveStudyFigures } from "@/db/queries/research/stored-figures";
import type { Grade } from "@/lib/domain/vocab";
import { storedFigures } from "./stored-figures";

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

const maxAge = () => Number(process.env.DENTATE_STUDY_FIGURES_MAX_AGE_S ?? 300);
export { maxAge as maxAgeSeconds };

// Keys are "studyId:siteId".
const store = storedFigures<SiteFigures>("study-figures", {
  read: async (keys) => {
    const studyId = keys[0]?.split(":")[0];
    if (!studyId) return [];
    const rows = await readStudyFigures<SiteFigures>(studyId, keys.map((k) => k.split(":")[1]!));
    return rows.map((r) => ({ key: `${studyId}:${r.siteId}`, computedAt: r.computedAt, figures: r.figures }));
  },
  compute: (key) => {
    const [studyId, siteId] = key.split(":") as [string, string];
    return computeSiteFigures(studyId, siteId);
  },
  save: (key, at, figures) => {
    const [studyId, siteId] = key.split(":") as [string, string];
    return saveStudyFigures(studyId, siteId, at, figures);
  },
  maxAgeSeconds: maxAge,
});

/** Works the figures out again now (the refresh a stale load starts, and what scripts and tests call). */
export function refreshStudyFigures(studyId: string, siteIds: string[]): Promise<void> {
  return store.refresh(siteIds.map((id) => `${studyId}:${id}`));
}

export interface StudyFigures {
  sites: SiteFigures[];
  asOf: Date;
  refreshing: boolean;
}

export async function loadStudyFigures(studyId: string, siteIds: string[], now = new Date()): Promise<StudyFigures> {
  const { items, asOf, refreshing } = await store.load(siteIds.map((id) => `${studyId}:${id}`), now);
  return { sites: items.map((i) => i.figures), asOf, refreshing };
}
