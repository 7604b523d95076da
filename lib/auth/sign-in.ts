import "server-only";
import { findUserCredentials } from "@/db/queries/users";
import { hitRateLimit, releaseRateLimit, resetRateLimit } from "@/lib/server/rate-limit";
import { recordAudit } from "@/lib/server/audit";
import { AppError } from "@/lib/errors";
import type { Role } from "@/lib/domain/vocab";
import { dummyHash, verifyPassword } from "./password";
import { createSession } from "./session";
import { assertServable } from "./servable";

// Per account and per address, fixed 15-minute windows (common practice, no source).
export const SIGN_IN_LIMITS = { perAccount: 10, perAddress: 50, windowSeconds: 15 * 60 } as const;

/**
 * Checks the password and opens a new session (a new id every time, so a session id planted
 * before sign-in is never promoted). The answer is the same for an unknown address and a wrong
 * password.
 */
export async function signIn(email: string, password: string, ip: string): Promise<{ sessionId: string; userId: string; role: Role }> {
  await assertServable();
  // Counted before the password is checked, atomically, so a burst cannot slip past the limit;
  // a successful sign-in then gives its attempt back (only failures accumulate).
  const accountKey = `sign-in:account:${email}`;
  const addressKey = `sign-in:ip:${ip}`;
  const [accountHits, addressHits] = await Promise.all([
    hitRateLimit(accountKey, SIGN_IN_LIMITS.windowSeconds),
    hitRateLimit(addressKey, SIGN_IN_LIMITS.windowSeconds),
  ]);
  if (accountHits > SIGN_IN_LIMITS.perAccount || addressHits > SIGN_IN_LIMITS.perAddress) {
    await recordAudit({ action: "sign_in.rate_limited", ip, detail: { email } });
    throw new AppError("rate_limited");
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
