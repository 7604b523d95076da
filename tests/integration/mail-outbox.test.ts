import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { randomUUID } from "node:crypto";
import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import { mailOutbox } from "@/db/schema";
import { deliverPending, enqueueMail } from "@/lib/server/outbox";
import { messageIdFor } from "@/lib/mail/config";
import { MaildevFake } from "./maildev-fake";

const fake = new MaildevFake();
beforeAll(() => fake.start());
afterAll(() => fake.stop());

const later = (ms: number) => new Date(Date.now() + ms);

describe("mail outbox against a real fake SMTP server", () => {
  it("queues in the caller's transaction: a rollback queues nothing, a repeated key queues once", async () => {
    const key = `test:${randomUUID()}`;
    await db.transaction(async (tx) => {
      await enqueueMail(tx, { idempotencyKey: key, to: "a@test.example", subject: "s", text: "t" });
      tx.rollback();
    }).catch(() => null);
    expect(await db.select().from(mailOutbox).where(eq(mailOutbox.idempotencyKey, key))).toHaveLength(0);
    expect(await enqueueMail(db, { idempotencyKey: key, to: "a@test.example", subject: "s", text: "t" })).toBe(true);
    expect(await enqueueMail(db, { idempotencyKey: key, to: "a@test.example", subject: "s", text: "t" })).toBe(false);
  });

  it("loses nothing while the SMTP server is down and sends once, with the key's Message-ID, when it returns", async () => {
    const to = `down-${randomUUID()}@test.example`;
    const key = `test:${randomUUID()}`;
    await enqueueMail(db, { idempotencyKey: key, to, subject: "Outage test", text: "hello" });
    await fake.stop();
    const during = await deliverPending({ now: later(60 * 60 * 1000) });
    expect(during.sent).toBe(0);
    const [row] = await db.select().from(mailOutbox).where(eq(mailOutbox.idempotencyKey, key));
    expect(row!.status).toBe("pending");
    expect(row!.attempts).toBe(1);
    expect(row!.lastError).toBeTruthy();
    expect(row!.nextAttemptAt.getTime()).toBeGreaterThan(Date.now());

    await fake.start();
    // Not yet due: the backoff holds it back.
    await deliverPending();
    expect(await fake.mailsTo(to)).toHaveLength(0);
    // Due later: it goes out exactly once, and a second round sends nothing more.
    await deliverPending({ now: later(2 * 60 * 60 * 1000) });
    await deliverPending({ now: later(3 * 60 * 60 * 1000) });
    const got = await fake.mailsTo(to);
    expect(got).toHaveLength(1);
    expect(got[0]!.headers["message-id"]).toBe(messageIdFor(key, "dentate.example"));
    const [after] = await db.select().from(mailOutbox).where(eq(mailOutbox.idempotencyKey, key));
    expect(after!.status).toBe("sent");
    expect(after!.attempts).toBe(2);
  });

  it("a server killed in the middle of a round loses nothing: every message arrives once after restart", async () => {
    const to = `kill-${randomUUID()}@test.example`;
    const keys = Array.from({ length: 8 }, () => `test:${randomUUID()}`);
    for (const [i, key] of keys.entries()) await enqueueMail(db, { idempotencyKey: key, to, subject: `Batch ${i}`, text: "x" });
    const round = deliverPending({ now: later(60 * 60 * 1000) });
    await new Promise((r) => setTimeout(r, 30));
    await fake.stop();
    await round;
    await fake.start();
    for (let i = 0; i < 5; i++) await deliverPending({ now: later((i + 2) * 60 * 60 * 1000) });
    const subjects = (await fake.mailsTo(to)).map((m) => m.subject).sort();
    expect(subjects).toEqual(keys.map((_, i) => `Batch ${i}`).sort());
  });

  it("two workers at once never send the same row twice (FOR UPDATE SKIP LOCKED)", async () => {
    const to = `pair-${randomUUID()}@test.example`;
    for (let i = 0; i < 6; i++) await enqueueMail(db, { idempotencyKey: `test:${randomUUID()}`, to, subject: `Pair ${i}`, text: "x" });
    const now = later(10 * 60 * 60 * 1000);
    const [a, b] = await Promise.all([deliverPending({ now }), deliverPending({ now })]);
    expect(a.sent + b.sent).toBeGreaterThanOrEqual(6);
    expect(await fake.mailsTo(to)).toHaveLength(6);
  });
});
