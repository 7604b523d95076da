import "server-only";
import { db } from "@/db/client";
import { lockDraftVisit } from "@/db/queries/visit-access";
import { lockPatientStatusesOfVisit } from "@/db/queries/patient-lock";
import { deleteDraftVisit, visitContents, visitIsReviewed } from "@/db/queries/visit-discard";
import { recordAudit } from "@/db/queries/audit-write";
import type { SiteScope } from "@/db/queries/scope";
import type { CurrentUser } from "@/lib/auth/guard";
import { AppError } from "@/lib/errors";
import { deleteObjects } from "@/lib/storage";
import { refreshTrackStatuses } from "./track-statuses";

/**
 * Discards a draft visit started by mistake: only its examiner or an administrator, with a reason.
 * A signed visit is never discarded (423). The visit leaves every list and the timeline; the audit
 * row keeps who, why, and what the draft held (its header and lesions), so the trail still shows it.
 */
export async function discardDraftVisit(scope: SiteScope, user: Pick<CurrentUser, "id" | "role">, visitId: string, reason: string, ip: string) {
  const files = await db.transaction(async (tx) => {
    // The patient's status lock first, as every writer of the patient's visits takes it.
    const [, v] = await Promise.all([lockPatientStatusesOfVisit(tx, scope, visitId), lockDraftVisit(tx, scope, visitId)]);
    if (user.role !== "admin" && v.examinerId !== user.id) throw new AppError("forbidden", "Only the visit's examiner or an administrator can discard a draft visit.");
    if (await visitIsReviewed(tx, v.id)) throw new AppError("conflict", "A review names this visit, so it cannot be discarded.");
    const contents = await visitContents(tx, v.id);
    await deleteDraftVisit(tx, v.id, v.patientId);
    await refreshTrackStatuses(tx, v.patientId, v.siteId);
    await recordAudit({
      userId: user.id, siteId: v.siteId, patientId: v.patientId, action: "visit.discard", entityType: "visit", entityId: v.id, ip,
      detail: { reason, visit: { visitDate: v.visitDate, examinerId: v.examinerId, version: v.version }, lesions: contents.lesions, files: contents.files.map((f) => f.id) },
    }, tx);
    return contents.files;
  });
  // An object left by a failed delete is only unreachable, never shown.
  const keys = files.flatMap((f) => [f.objectKey, f.thumbKey ?? ""]).filter(Boolean);
  if (keys.length) await deleteObjects(keys).catch((e) => console.error("[dentate] could not remove objects of a discarded visit", keys, e));
}
