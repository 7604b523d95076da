import "server-only";
// The patient list: one statement for the patients and their latest visit, grade and open
// disagreements; the next due date from the due-date rules (lib/due-dates), for the page's patients,
// or for all of the caller's patients when the list is sorted by it.
import { patientList, type ListSort } from "@/db/queries/patient-list";
import type { SiteScope } from "@/db/queries/scope";
import { GRADES, GRADE_RANK } from "@/lib/domain/vocab";
import type { PatientSort } from "@/lib/validation/patients";
import { computeDue, todayIso } from "./due-dates";

const GRADES_BY_RANK = [...GRADES].sort((a, b) => GRADE_RANK[a] - GRADE_RANK[b]);

export interface PatientListOptions {
  q?: string;
  page: number;
  sort: PatientSort;
  dir: "asc" | "desc";
}

export async function listPatientOverview(scope: SiteScope, o: PatientListOptions, today = todayIso()) {
  let orderIds: string[] | undefined;
  let dueById: Map<string, { dueDate: string; overdueDays: number; dateProblem?: boolean }> | undefined;
  if (o.sort === "nextDue") {
    const all = await computeDue({ scope }, today);
    all.sort((a, b) => a.dueDate.localeCompare(b.dueDate) || a.patientId.localeCompare(b.patientId));
    orderIds = all.map((d) => d.patientId);
    dueById = new Map(all.map((d) => [d.patientId, d]));
  }
  const sort: ListSort = o.sort === "nextDue" ? "order" : o.sort;
  const list = await patientList(scope, { q: o.q, page: o.page, sort, dir: o.dir, gradesByRank: GRADES_BY_RANK, orderIds });
  if (!dueById) {
    const due = await computeDue({ scope, patientIds: list.rows.map((r) => r.id) }, today);
    dueById = new Map(due.map((d) => [d.patientId, d]));
  }
  const due = dueById;
  return {
    ...list,
    rows: list.rows.map((r) => {
      const d = r.status === "active" ? due.get(r.id) : undefined;
      return { ...r, nextDue: d?.dateProblem ? null : d?.dueDate ?? null, overdueDays: d?.overdueDays ?? 0, dateProblem: d?.dateProblem ?? false };
    }),
  };
}
export type PatientOverviewRow = Awaited<ReturnType<typeof listPatientOverview>>["rows"][number];
