import "server-only";
// Patients due and overdue. Due dates are computed, not stored, so the list is filtered and
// sorted after computing; fine for a clinic's few thousand patients (see the report's caveat).
import { and, eq, inArray } from "drizzle-orm";
import { db } from "../client";
import { patients, users, userSites } from "../schema";
import { inScope, type SiteScope } from "./scope";
import { computeDue, todayIso, type PatientDue } from "./due-dates";
import { dayNumber } from "@/lib/dates/calendar";

export const WORKLIST_PAGE_SIZE = 25;
/** Patients due within this many days appear before they are overdue. */
export const DUE_SOON_DAYS = 30;

export const WORKLIST_SORTS = ["due", "name", "clinician", "site"] as const;
export type WorklistSort = (typeof WORKLIST_SORTS)[number];

export interface WorklistFilters {
  clinicianId?: string;
  siteId?: string;
  /** Only patients at least this many days overdue; undefined also lists those due soon. */
  minOverdueDays?: number;
  sort?: WorklistSort;
  dir?: "asc" | "desc";
  page?: number;
}

const COMPARE: Record<WorklistSort, (a: PatientDue, b: PatientDue) => number> = {
  due: (a, b) => a.dueDate.localeCompare(b.dueDate),
  name: (a, b) => `${a.familyName} ${a.givenName}`.localeCompare(`${b.familyName} ${b.givenName}`),
  clinician: (a, b) => (a.clinicianName ?? "~").localeCompare(b.clinicianName ?? "~"),
  site: (a, b) => a.siteName.localeCompare(b.siteName),
};

export function selectWorklist(rows: PatientDue[], f: WorklistFilters, today: string) {
  const horizon = dayNumber(today) + DUE_SOON_DAYS;
  const kept = rows.filter((r) => (f.minOverdueDays === undefined ? dayNumber(r.dueDate) <= horizon : r.overdueDays >= Math.max(1, f.minOverdueDays)));
  const cmp = COMPARE[f.sort ?? "due"];
  const sign = f.dir === "desc" ? -1 : 1;
  kept.sort((a, b) => sign * cmp(a, b) || a.dueDate.localeCompare(b.dueDate) || a.patientId.localeCompare(b.patientId));
  const pageCount = Math.max(1, Math.ceil(kept.length / WORKLIST_PAGE_SIZE));
  const page = Math.min(Math.max(1, f.page ?? 1), pageCount);
  return { rows: kept.slice((page - 1) * WORKLIST_PAGE_SIZE, page * WORKLIST_PAGE_SIZE), total: kept.length, page, pageCount };
}

export async function listWorklist(scope: SiteScope, f: WorklistFilters, today = todayIso()) {
  const where = and(
    inScope(patients.siteId, scope),
    f.siteId ? eq(patients.siteId, f.siteId) : undefined,
    f.clinicianId ? eq(patients.clinicianId, f.clinicianId) : undefined,
  );
  return selectWorklist(await computeDue(where, today), f, today);
}

/** Clinicians who can be responsible for patients at the caller's sites, for the filter. */
export async function listClinicians(siteIds: string[]) {
  if (siteIds.length === 0) return [];
  return db
    .selectDistinct({ id: users.id, displayName: users.displayName })
    .from(users)
    .innerJoin(userSites, eq(userSites.userId, users.id))
    .where(and(inArray(userSites.siteId, siteIds), inArray(users.role, ["clinician", "admin"])))
    .orderBy(users.displayName);
}

/** For the reminders job, across all sites: everyone overdue today. */
export async function listOverdue(today = todayIso()): Promise<PatientDue[]> {
  return (await computeDue(undefined, today)).filter((r) => r.overdueDays > 0);
}

