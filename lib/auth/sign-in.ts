import "server-only";
import { findUserCredentials } from "@/db/queries/users";
import { claimAttempts, releaseRateLimit, resetRateLimit } from "@/lib/server/rate-limit";
import { recordAudit } from "@/lib/server/audit";
import { AppError } from "@/lib/errors";
import type { Role } from "@/lib/domain/vocab";
import { SIGN_IN_THROTTLE, SIGN_IN_WINDOW_SECONDS } from "@/lib/accounts/sign-in-throttle";
import { dummyHash, verifyPassword } from "./password";
import { createSession } from "./session";
import { assertServable } from "./servable";

export { SIGN_IN_THROTTLE, SIGN_IN_WINDOW_SECONDS };

/**
 * Checks the password and opens a new session (a new id every time, so a session id planted
 * before sign-in is never promoted). The answer is the same for an unknown address and a wrong
 * password. `now` is the clock the attempt counters use (tests move it; nothing else should).
 */
export async function signIn(email: string, password: string, ip: string, now = new Date()): Promise<{ sessionId: string; userId: string; role: Role }> {
  await assertServable();
  // Counted before the password is checked, atomically, so a burst cannot slip past the delay;
  // a successful sign-in then clears the account's count and gives the address its attempt back.
  const accountKey = `sign-in:account:${email.trim().toLowerCase()}`;
  const addressKey = `sign-in:ip:${ip}`;
  const refusal = await claimAttempts(
    [{ key: accountKey, policy: SIGN_IN_THROTTLE.account }, { key: addressKey, policy: SIGN_IN_THROTTLE.address }],
    SIGN_IN_WINDOW_SECONDS,
    now,
  );
  if (refusal) {
    await recordAudit({ action: "sign_in.rate_limited", ip, detail: { email, by: refusal.key === accountKey ? "account" : "address", hard: refusal.hard } });
    throw new AppError("rate_limited", refusal.hard
      ? "Too many failed sign-ins from this network. Try again in 15 minutes, or ask an administrator."
      : `Too many failed attempts. Wait ${refusal.waitSeconds} second${refusal.waitSeconds === 1 ? "" : "s"}, then try again.`);
  }
  const account = await findUserCredentials(email);
  const ok = account?.passwordHash
    ? await verifyPassword(account.passwordHash, password)
    : (await verifyPassword(await dummyHash(), password), false);
  if (!account || !ok || !account.active) {
    await recordAudit({ userId: account?.id ?? null, action: "sign_in.failed", ip, detail: { email } });
    throw new AppError("unauthenticated", "That e-mail and password do not match an active account.");
  }
  await Promise.all([resetRateLimit(accountKey), releaseRateLimit(addressKey)]);
  const sessionId = await createSession(account.id);
  await recordAudit({ userId: account.id, action: "sign_in.succeeded", ip });
  return { sessionId, userId: account.id, role: account.role };
}
