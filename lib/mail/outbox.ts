import "server-only";
// The outbox: mail is written in the same transaction as the change that causes it, and a
// worker sends it later. A rollback therefore sends nothing, and an SMTP outage loses nothing.
//
// Exactly-once is not possible over SMTP. Each row is sent while its row lock is held and marked
// sent in the same transaction, so two workers never send the same row. The remaining window:
// if the process dies after the server accepted the message but before the commit, the row is
// still pending and goes out again. That copy carries the same Message-ID (derived from the
// idempotency key), so it is recognisable as a duplicate.
import { and, asc, eq, lte, sql } from "drizzle-orm";
import { db, type Tx } from "@/db/client";
import { mailOutbox } from "@/db/schema";
import { MAX_MAIL_ATTEMPTS, mailConfigFrom, messageIdFor, retryDelayMs, senderDomain } from "./config";
import { mailTransport } from "./transport";

export interface OutgoingMail {
  /** Same key, same message: a second enqueue with it is ignored. */
  idempotencyKey: string;
  to: string;
  subject: string;
  text: string;
}

/** Returns true when the row was new. */
export async function enqueueMail(tx: Tx | typeof db, mail: OutgoingMail): Promise<boolean> {
  const rows = await tx
    .insert(mailOutbox)
    .values({ idempotencyKey: mail.idempotencyKey, toAddress: mail.to, subject: mail.subject, textBody: mail.text })
    .onConflictDoNothing({ target: mailOutbox.idempotencyKey })
    .returning({ id: mailOutbox.id });
  return rows.length > 0;
}

export interface DeliveryReport {
  sent: number;
  retrying: number;
  failed: number;
}

/**
 * Sends what is due, one row per transaction, until nothing is due or `limit` rows were tried.
 * `now` lets a caller (the tests) look at the queue as it will be later.
 */
export async function deliverPending(opts: { now?: Date; limit?: number } = {}): Promise<DeliveryReport> {
  const config = mailConfigFrom(process.env);
  const transport = mailTransport(config);
  const domain = senderDomain(config.from);
  const report: DeliveryReport = { sent: 0, retrying: 0, failed: 0 };
  const limit = opts.limit ?? 50;
  for (let i = 0; i < limit; i++) {
    const now = opts.now ?? new Date();
    const outcome = await db.transaction(async (tx) => {
      const [row] = await tx
        .select()
        .from(mailOutbox)
        .where(and(eq(mailOutbox.status, "pending"), lte(mailOutbox.nextAttemptAt, now)))
        .orderBy(asc(mailOutbox.nextAttemptAt), asc(mailOutbox.createdAt))
        .limit(1)
        .for("update", { skipLocked: true });
      if (!row) return "empty" as const;
      try {
        await transport.sendMail({
          from: config.from,
          to: row.toAddress,
          subject: row.subject,
          text: row.textBody,
          messageId: messageIdFor(row.idempotencyKey, domain),
          headers: { "Auto-Submitted": "auto-generated" },
        });
      } catch (err) {
        const attempts = row.attempts + 1;
        const gaveUp = attempts >= MAX_MAIL_ATTEMPTS;
        await tx
          .update(mailOutbox)
          .set({
            attempts,
            status: gaveUp ? "failed" : "pending",
            lastError: String((err as Error)?.message ?? err).slice(0, 500),
            nextAttemptAt: new Date(now.getTime() + retryDelayMs(attempts)),
          })
          .where(eq(mailOutbox.id, row.id));
        return gaveUp ? ("failed" as const) : ("retrying" as const);
      }
      await tx
        .update(mailOutbox)
        .set({ status: "sent", sentAt: sql`now()`, attempts: row.attempts + 1, lastError: null })
        .where(eq(mailOutbox.id, row.id));
      return "sent" as const;
    });
    if (outcome === "empty") break;
    report[outcome]++;
  }
  return report;
}
