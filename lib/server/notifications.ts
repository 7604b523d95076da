import "server-only";
import type { Tx } from "@/db/client";
import { reviewMailParties } from "@/db/queries/outbox";
import { mailConfigFrom } from "@/lib/mail/config";
import { reviewRequestedMail } from "@/lib/mail/templates";
import { enqueueMail } from "./outbox";

/**
 * Queues the "review requested" mail to the review's reviewer, in the caller's transaction.
 * `path` is where the link points inside the app (defaults to the patient page).
 * Returns false when the review has no reviewer, the reviewer is inactive, or it was queued before.
 */
export async function notifyReviewRequested(tx: Tx, reviewId: string, opts: { path?: string } = {}): Promise<boolean> {
  const row = await reviewMailParties(tx, reviewId);
  if (!row || !row.reviewerActive) return false;
  const { appBaseUrl } = mailConfigFrom(process.env);
  const mail = reviewRequestedMail({
    reviewerName: row.reviewerName,
    requestedByName: row.requesterName ?? "A colleague",
    link: `${appBaseUrl}${opts.path ?? `/patients/${row.patientId}`}`,
  });
  return enqueueMail(tx, { idempotencyKey: `review-requested:${reviewId}`, to: row.reviewerEmail, ...mail });
}
