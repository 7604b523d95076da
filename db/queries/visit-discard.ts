import "server-only";
import { and, eq, or, sql as dsql } from "drizzle-orm";
import type { Tx } from "../client";
import { attachments, lesions, reviews, visits } from "../schema";

// Statements of discarding a draft visit (lib/server/visit-discard.ts decides and audits).

/** Whether a review names the visit (as the visit reviewed or the one compared with it). */
export async function visitIsReviewed(tx: Tx, visitId: string): Promise<boolean> {
  const rows = await tx.select({ id: reviews.id }).from(reviews).where(or(eq(reviews.visitId, visitId), eq(reviews.comparedVisitId, visitId))).limit(1);
  return rows.length > 0;
}

/** What the audit row keeps of the visit: its lesions as drawn, and its files' stored keys. */
export async function visitContents(tx: Tx, visitId: string) {
  const [lesionRows, files] = await Promise.all([
    tx.select({ id: lesions.id, label: lesions.label, trackId: lesions.trackId, clockStartH: lesions.clockStartH, clockEndH: lesions.clockEndH, distanceStartCm: lesions.distanceStartCm, distanceEndCm: lesions.distanceEndCm, grade: lesions.grade })
      .from(lesions).where(eq(lesions.visitId, visitId)),
    tx.select({ id: attachments.id, objectKey: attachments.objectKey, thumbKey: attachments.thumbKey }).from(attachments).where(eq(attachments.visitId, visitId)),
  ]);
  return { lesions: lesionRows, files };
}

/**
 * Deletes the visit (its lesions, biopsies, treatments, doses, notes and file rows go with it by
 * their cascades), then the patient's tracks that no lesion, check or adjudication names any more.
 */
export async function deleteDraftVisit(tx: Tx, visitId: string, patientId: string) {
  await tx.delete(visits).where(and(eq(visits.id, visitId), eq(visits.status, "draft")));
  await tx.execute(dsql`DELETE FROM lesion_tracks t WHERE t.patient_id = ${patientId}
    AND NOT EXISTS (SELECT 1 FROM lesions l WHERE l.track_id = t.id)
    AND NOT EXISTS (SELECT 1 FROM track_checks c WHERE c.track_id = t.id)
    AND NOT EXISTS (SELECT 1 FROM adjudications a WHERE a.track_id = t.id)`);
}
