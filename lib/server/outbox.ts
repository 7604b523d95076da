import "server-only";
// Outgoing mail is never sent inline: enqueueMail writes it to the outbox in the caller's
// transaction, and the mail worker (scripts/mail-worker.ts) delivers it with retries; the
// idempotency key decides the Message-ID.
import { db, type Db, type Tx } from "@/db/client";
import { insertOutboxMail, markMailAttemptFailed, markMailSent, nextDueMail } from "@/db/queries/outbox";
import { MAX_MAIL_ATTEMPTS, mailConfigFrom, messageIdFor, retryDelayMs, senderDomain } from "@/lib/mail/config";
import { mailTransport } from "@/lib/mail/transport";

export interface OutgoingMail {
  /** Same key, same message: a second enqueue with it is ignored. */
  idempotencyKey: string;
  to: string;
  subject: string;
  text: string;
}

/** Returns true when the row was new. */
export function enqueueMail(tx: Tx | Db, mail: OutgoingMail): Promise<boolean> {
  return insertOutboxMail(tx, mail);
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
      const row = await nextDueMail(tx, now);
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
        await markMailAttemptFailed(tx, row.id, {
          attempts, gaveUp, lastError: String((err as Error)?.message ?? err).slice(0, 500), nextAttemptAt: new Date(now.getTime() + retryDelayMs(attempts)),
        });
        return gaveUp ? ("failed" as const) : ("retrying" as const);
      }
      await markMailSent(tx, row.id, row.attempts + 1);
      return "sent" as const;
    });
    if (outcome === "empty") break;
    report[outcome]++;
  }
  return report;
}
