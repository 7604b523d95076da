import { describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { db, sql } from "@/db/client";
import { auditEvents, sessions } from "@/db/schema";
import { hashPassword } from "@/lib/auth/password";
import { signIn, SIGN_IN_THROTTLE } from "@/lib/auth/sign-in";
import { invalidateSession, validateSession } from "@/lib/auth/session";
import { makeSite, makeUser } from "../fixtures/factory";
import { AppError } from "@/lib/errors";
import { randomUUID } from "node:crypto";

async function account() {
  const site = await makeSite();
  const email = `c-${randomUUID()}@test.example`;
  const userId = await makeUser("clinician", [site.id], { email, passwordHash: await hashPassword("correct horse battery") });
  return { email, userId };
}

describe("sign-in", () => {
  it("opens a new session on every sign-in (no fixation) and sign-out ends it server-side", async () => {
    const { email, userId } = await account();
    const a = await signIn(email, "correct horse battery", "10.0.0.1");
    const b = await signIn(email, "correct horse battery", "10.0.0.1");
    expect(a.userId).toBe(userId);
    expect(a.sessionId).not.toBe(b.sessionId);
    expect(await validateSession(a.sessionId)).not.toBeNull();
    await invalidateSession(a.sessionId);
    expect(await validateSession(a.sessionId)).toBeNull();
    expect(await db.select().from(sessions).where(eq(sessions.id, a.sessionId))).toHaveLength(0);
  });

  it("gives the same answer for a wrong password and an unknown address, and audits both", async () => {
    const { email } = await account();
    const wrong = await signIn(email, "nope", "10.0.0.2").catch((e) => e);
    const unknown = await signIn(`nobody-${randomUUID()}@test.example`, "nope", "10.0.0.2").catch((e) => e);
    expect(wrong).toBeInstanceOf(AppError);
    expect(unknown).toBeInstanceOf(AppError);
    expect(wrong.message).toBe(unknown.message);
    expect(wrong.status).toBe(401);
    const failed = await db.select().from(auditEvents).where(eq(auditEvents.action, "sign_in.failed"));
    expect(failed.length).toBeGreaterThanOrEqual(2);
  });

  // OWASP Authentication Cheat Sheet, "Account Lockout" (from memory): a lockout that anyone who
  // knows the e-mail can trigger denies the owner; a growing delay does not.
  it("lets the owner in with the right password after ten wrong ones once the delay has passed (no account lockout)", async () => {
    const { email, userId } = await account();
    const t0 = Date.now();
    // Ten guesses from ten addresses, each one minute after the previous (past every delay).
    for (let i = 0; i < 10; i++) {
      const err = await signIn(email, "wrong", `10.1.${Math.floor(Math.random() * 250)}.${i}`, new Date(t0 + i * 61_000)).catch((e) => e);
      expect(err.code).toBe("unauthenticated");
    }
    const owner = await signIn(email, "correct horse battery", "10.1.1.1", new Date(t0 + 10 * 61_000));
    expect(owner.userId).toBe(userId);
  });

  it("refuses an attempt inside the account's delay without checking the password, then lets the right one in", async () => {
    const { email } = await account();
    const t0 = Date.now();
    const free = SIGN_IN_THROTTLE.account.free;
    for (let i = 0; i < free; i++) expect((await signIn(email, "wrong", "10.2.0.1", new Date(t0)).catch((e) => e)).code).toBe("unauthenticated");
    const early = await signIn(email, "correct horse battery", "10.2.0.1", new Date(t0 + 500)).catch((e) => e);
    expect(early.code).toBe("rate_limited");
    expect(early.message).toMatch(/Wait 1 second,/);
    await expect(signIn(email, "correct horse battery", "10.2.0.1", new Date(t0 + 1_000))).resolves.toHaveProperty("sessionId");
  });

  it("counts failures only: repeated successful sign-ins never slow the account, and a success clears its failures", async () => {
    const { email } = await account();
    const now = new Date();
    for (let i = 0; i < 15; i++) {
      await expect(signIn(email, "correct horse battery", "10.2.1.1", now)).resolves.toHaveProperty("sessionId");
    }
    const free = SIGN_IN_THROTTLE.account.free;
    for (let round = 0; round < 3; round++) {
      for (let i = 0; i < free - 1; i++) await signIn(email, "wrong", "10.2.1.2", now).catch(() => null);
      await expect(signIn(email, "correct horse battery", "10.2.1.2", now)).resolves.toHaveProperty("sessionId");
    }
  });

  it("locks one address outright after its hard limit across accounts, while another address still signs in", async () => {
    const { email } = await account();
    const ip = `10.9.${Math.floor(Math.random() * 200)}.9`;
    const t0 = Date.now();
    const { hardLimit, maxDelaySeconds } = SIGN_IN_THROTTLE.address;
    for (let i = 0; i < hardLimit; i++) {
      const err = await signIn(`x${i}-${randomUUID()}@test.example`, "wrong", ip, new Date(t0 + i * maxDelaySeconds * 1000)).catch((e) => e);
      expect(err.code).toBe("unauthenticated");
    }
    const at = new Date(t0 + hardLimit * maxDelaySeconds * 1000);
    const locked = await signIn(email, "correct horse battery", ip, at).catch((e) => e);
    expect(locked.code).toBe("rate_limited");
    expect(locked.message).toMatch(/15 minutes/);
    await expect(signIn(email, "correct horse battery", "10.9.250.1", at)).resolves.toHaveProperty("sessionId");
    // A new window opens the address again.
    await expect(signIn(email, "correct horse battery", ip, new Date(t0 + 16 * 60_000 + hardLimit * maxDelaySeconds * 1000))).resolves.toHaveProperty("sessionId");
  });

  it("counts an account's failures whatever the case of the typed e-mail", async () => {
    const { email } = await account();
    const now = new Date();
    for (let i = 0; i < SIGN_IN_THROTTLE.account.free; i++) await signIn(i % 2 ? email.toUpperCase() : email, "wrong", `10.3.0.${i}`, now).catch(() => null);
    expect((await signIn(email.toUpperCase(), "wrong", "10.3.1.1", now).catch((e) => e)).code).toBe("rate_limited");
  });

  it("refuses to edit or delete audit events (append-only)", async () => {
    await expect(sql`update audit_events set action = ${"x"}`).rejects.toThrow(/append-only/);
    await expect(sql`delete from audit_events`).rejects.toThrow(/append-only/);
  });
});
