// The worklist: patients due soon or overdue, filtered, sorted and paged (due dates are computed,
// not stored, so the list is filtered and sorted after computing; fine for a clinic's few thousand patients).
import { dayNumber } from "@/lib/dates/calendar";

export const WORKLIST_PAGE_SIZE = 25;
/** Patients due within this many days appear before they are overdue. */
export const DUE_SOON_DAYS = 30;

export const WORKLIST_SORTS = ["due", "name", "clinician", "site"] as const;
export type WorklistSort = (typeof WORKLIST_SORTS)[number];

/** What the worklist reads of a patient's due date. */
export interface WorklistRow {
  patientId: string;
  dueDate: string;
  overdueDays: number;
  familyName: string;
  givenName: string;
  clinicianName: string | null;
  siteName: string;
  /** A stored date could not be worked with: always listed (flagged) so someone corrects it. */
  dateProblem?: boolean;
}

export interface WorklistFilters {
  clinicianId?: string;
  siteId?: string;
  /** Only patients at least this many days overdue; undefined also lists those due soon. */
  minOverdueDays?: number;
  sort?: WorklistSort;
  dir?: "asc" | "desc";
  page?: number;
}

const COMPARE: Record<WorklistSort, (a: WorklistRow, b: WorklistRow) => number> = {
  due: (a, b) => a.dueDate.localeCompare(b.dueDate),
  name: (a, b) => `${a.familyName} ${a.givenName}`.localeCompare(`${b.familyName} ${b.givenName}`),
  clinician: (a, b) => (a.clinicianName ?? "~").localeCompare(b.clinicianName ?? "~"),
  site: (a, b) => a.siteName.localeCompare(b.siteName),
};

export function selectWorklist<R extends WorklistRow>(rows: R[], f: WorklistFilters, today: string) {
  const horizon = dayNumber(today) + DUE_SOON_DAYS;
  const kept = rows.filter((r) => r.dateProblem || (f.minOverdueDays === undefined ? dayNumber(r.dueDate) <= horizon : r.overdueDays >= Math.max(1, f.minOverdueDays)));
  const cmp = COMPARE[f.sort ?? "due"];
  const sign = f.dir === "desc" ? -1 : 1;
  kept.sort((a, b) => sign * cmp(a, b) || a.dueDate.localeCompare(b.dueDate) || a.patientId.localeCompare(b.patientId));
  const pageCount = Math.max(1, Math.ceil(kept.length / WORKLIST_PAGE_SIZE));
  const page = Math.min(Math.max(1, f.page ?? 1), pageCount);
  return { rows: kept.slice((page - 1) * WORKLIST_PAGE_SIZE, page * WORKLIST_PAGE_SIZE), total: kept.length, page, pageCount };
}

