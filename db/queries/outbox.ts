import "server-only";
import { alias } from "drizzle-orm/pg-core";
import { and, asc, eq, lte, sql } from "drizzle-orm";
import type { Db, Tx } from "../client";
import { mailOutbox, reviews, users } from "../schema";

/** Returns true when the row was new (a second insert with the same key is ignored). */
export async function insertOutboxMail(run: Db | Tx, mail: { idempotencyKey: string; to: string; subject: string; text: string }): Promise<boolean> {
  const rows = await run
    .insert(mailOutbox)
    .values({ idempotencyKey: mail.idempotencyKey, toAddress: mail.to, subject: mail.subject, textBody: mail.text })
    .onConflictDoNothing({ target: mailOutbox.idempotencyKey })
    .returning({ id: mailOutbox.id });
  return rows.length > 0;
}

/** The next mail due at `now`, locked; another worker skips it. */
export async function nextDueMail(tx: Tx, now: Date) {
  const [row] = await tx
    .select()
    .from(mailOutbox)
    .where(and(eq(mailOutbox.status, "pending"), lte(mailOutbox.nextAttemptAt, now)))
    .orderBy(asc(mailOutbox.nextAttemptAt), asc(mailOutbox.createdAt))
    .limit(1)
    .for("update", { skipLocked: true });
  return row ?? null;
}

export async function markMailAttemptFailed(tx: Tx, id: string, set: { attempts: number; gaveUp: boolean; lastError: string; nextAttemptAt: Date }): Promise<void> {
  await tx
    .update(mailOutbox)
    .set({ attempts: set.attempts, status: set.gaveUp ? "failed" : "pending", lastError: set.lastError, nextAttemptAt: set.nextAttemptAt })
    .where(eq(mailOutbox.id, id));
}

export async function markMailSent(tx: Tx, id: string, attempts: number): Promise<void> {
  await tx.update(mailOutbox).set({ status: "sent", sentAt: sql`now()`, attempts, lastError: null }).where(eq(mailOutbox.id, id));
}

/** Who a review-requested mail goes to, and who asked. */
export async function reviewMailParties(tx: Tx, reviewId: string) {
  const reviewer = alias(users, "reviewer");
  const requester = alias(users, "requester");
  const [row] = await tx
    .select({ patientId: reviews.patientId, reviewerEmail: reviewer.email, reviewerName: reviewer.displayName, reviewerActive: reviewer.active, requesterName: requester.displayName })
    .from(reviews)
    .innerJoin(reviewer, eq(reviewer.id, reviews.reviewerId))
    .leftJoin(requester, eq(requester.id, reviews.requestedBy))
    .where(eq(reviews.id, reviewId))
    .limit(1);
  return row ?? null;
}
