import { describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { db, sql } from "@/db/client";
import { auditEvents, sessions } from "@/db/schema";
import { hashPassword } from "@/lib/auth/password";
import { signIn, SIGN_IN_LIMITS } from "@/lib/auth/sign-in";
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

  it("rate-limits an account after the per-account limit, even with the right password", async () => {
    const { email } = await account();
    for (let i = 0; i < SIGN_IN_LIMITS.perAccount; i++) await signIn(email, "wrong", `10.1.0.${i}`).catch(() => null);
    const err = await signIn(email, "correct horse battery", "10.1.1.1").catch((e) => e);
    expect(err).toBeInstanceOf(AppError);
    expect(err.code).toBe("rate_limited");
  });

  it("counts failures only: repeated successful sign-ins never lock the account out", async () => {
    const { email } = await account();
    for (let i = 0; i < SIGN_IN_LIMITS.perAccount + 5; i++) {
      await expect(signIn(email, "correct horse battery", "10.2.0.1")).resolves.toHaveProperty("sessionId");
    }
    // A success clears earlier failures of the account.
    for (let i = 0; i < SIGN_IN_LIMITS.perAccount - 1; i++) await signIn(email, "wrong", "10.2.0.2").catch(() => null);
    await signIn(email, "correct horse battery", "10.2.0.2");
    for (let i = 0; i < SIGN_IN_LIMITS.perAccount - 1; i++) await signIn(email, "wrong", "10.2.0.3").catch(() => null);
    await expect(signIn(email, "correct horse battery", "10.2.0.3")).resolves.toHaveProperty("sessionId");
  });

  it("rate-limits an address across accounts", async () => {
    const ip = `10.9.${Math.floor(Math.random() * 200)}.9`;
    let limited = false;
    for (let i = 0; i < SIGN_IN_LIMITS.perAddress + 2; i++) {
      const err = await signIn(`x${i}-${randomUUID()}@test.example`, "wrong", ip).catch((e) => e);
      if (err?.code === "rate_limited") limited = true;
    }
    expect(limited).toBe(true);
  });

  it("refuses to edit or delete audit events (append-only)", async () => {
    await expect(sql`update audit_events set action = ${"x"}`).rejects.toThrow(/append-only/);
    await expect(sql`delete from audit_events`).rejects.toThrow(/append-only/);
  });
});
