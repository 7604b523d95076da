import "server-only";
import { eq } from "drizzle-orm";
import { alias } from "drizzle-orm/pg-core";
import type { Tx } from "@/db/client";
import { reviews, users } from "@/db/schema";
import { mailConfigFrom } from "./config";
import { enqueueMail } from "./outbox";
import { reviewRequestedMail } from "./templates";

/**
 * Queues the "review requested" mail to the review's reviewer, in the caller's transaction.
 * `path` is where the link points inside the app (defaults to the patient page).
 * Returns false when the review has no reviewer, the reviewer is inactive, or it was queued before.
 */
export async function notifyReviewRequested(tx: Tx, reviewId: string, opts: { path?: string } = {}): Promise<boolean> {
  const reviewer = alias(users, "reviewer");
  const requester = alias(users, "requester");
  const [row] = await tx
    .select({
      patientId: reviews.patientId,
      reviewerEmail: reviewer.email,
      reviewerName: reviewer.displayName,
      reviewerActive: reviewer.active,
      requesterName: requester.displayName,
    })
    .from(reviews)
    .innerJoin(reviewer, eq(reviewer.id, reviews.reviewerId))
    .leftJoin(requester, eq(requester.id, reviews.requestedBy))
    .where(eq(reviews.id, reviewId))
    .limit(1);
  if (!row || !row.reviewerActive) return false;
  const { appBaseUrl } = mailConfigFrom(process.env);
  const mail = reviewRequestedMail({
    reviewerName: row.reviewerName,
    requestedByName: row.requesterName ?? "A colleague",
    link: `${appBaseUrl}${opts.path ?? `/patients/${row.patientId}`}`,
  });
  return enqueueMail(tx, { idempotencyKey: `review-requested:${reviewId}`, to: row.reviewerEmail, ...mail });
}
