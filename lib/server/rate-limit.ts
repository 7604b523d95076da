import "server-only";
// Counters kept in PostgreSQL, so every app process shares them.
import { db } from "@/db/client";
import { claimAttempt } from "@/db/queries/users";
import { delayTable, type ThrottlePolicy } from "@/lib/accounts/sign-in-throttle";
export { hitRateLimit, releaseRateLimit, resetRateLimit } from "@/db/queries/users";

export interface ThrottleKey {
  key: string;
  policy: ThrottlePolicy;
}

export type ThrottleRefusal = { key: string; count: number; hard: boolean; waitSeconds: number };

/**
 * Counts one attempt under every key, or under none: the first key that says "too soon" (or
 * "locked") refuses the attempt and nothing is counted. Keys are claimed in the order given, so
 * callers that always pass them in the same order cannot deadlock.
 */
export async function claimAttempts(keys: ThrottleKey[], windowSeconds: number, now = new Date()): Promise<ThrottleRefusal | null> {
  const refused = Symbol("refused");
  let refusal: ThrottleRefusal | null = null;
  try {
    await db.transaction(async (tx) => {
      for (const k of keys) {
        const delays = delayTable(k.policy);
        const r = await claimAttempt(tx, { key: k.key, windowSeconds, delays, hardLimit: k.policy.hardLimit, now });
        if (!r.allowed) {
          const hard = k.policy.hardLimit !== null && r.count >= k.policy.hardLimit;
          refusal = { key: k.key, count: r.count, hard, waitSeconds: hard ? windowSeconds : delays[Math.min(r.count, delays.length - 1)]! };
          throw refused;
        }
      }
    });
  } catch (err) {
    if (err !== refused) throw err;
  }
  return refusal;
}
