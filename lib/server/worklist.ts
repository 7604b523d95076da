import "server-only";
import type { SiteScope } from "@/db/queries/scope";
import { selectWorklist, type WorklistFilters } from "@/lib/due-dates/worklist";
import { computeDue, todayIso, type PatientDue } from "./due-dates";

export async function listWorklist(scope: SiteScope, f: WorklistFilters, today = todayIso()) {
  return selectWorklist(await computeDue({ scope, siteId: f.siteId, clinicianId: f.clinicianId, activeOnly: true }, today), f, today);
}

/** For the reminders job, across all sites: everyone still followed who is overdue today. */
export async function listOverdue(today = todayIso()): Promise<PatientDue[]> {
  return (await computeDue({ activeOnly: true }, today)).filter((r) => r.overdueDays > 0);
}

