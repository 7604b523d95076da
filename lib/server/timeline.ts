import "server-only";
import { readTimelineRows } from "@/db/queries/timeline";
import type { ReadAudit } from "@/db/queries/audit-write";
import type { SiteScope } from "@/db/queries/scope";
import { assembleTimeline, type TimelineDto } from "@/lib/timeline/assemble";

/**
 * Everything the timeline and compare screens need for one patient, read in one statement whatever
 * the number of visits and lesions; the same statement records the read when the patient is in scope.
 */
export async function loadTimeline(scope: SiteScope, patientId: string, audit: ReadAudit): Promise<TimelineDto> {
  return assembleTimeline(await readTimelineRows(scope, patientId, audit));
}
