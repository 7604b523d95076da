// How sign-in slows down a guesser without locking out the person whose e-mail is being guessed.
// Failures are counted per account and per client address in a 15-minute window. After a few free
// failures each further attempt must wait a doubling delay (capped) after the previous one; the
// right password after the wait still signs in. Only an address is ever locked outright, so a
// stranger cannot keep a clinician out of their own account.

export interface ThrottlePolicy {
  /** Failures allowed with no wait. */
  free: number;
  /** The longest wait between two attempts, in seconds. */
  maxDelaySeconds: number;
  /** Failures after which every attempt is refused until the window ends (null: never). */
  hardLimit: number | null;
}

export const SIGN_IN_WINDOW_SECONDS = 15 * 60;

// A shared clinic network puts several people behind one address, so it gets more free tries and
// a short wait; its hard limit stops one address from trying password after password across many
// accounts (reachable within a window: 20 free, then at most 5 s apart).
export const SIGN_IN_THROTTLE = {
  account: { free: 3, maxDelaySeconds: 60, hardLimit: null },
  address: { free: 20, maxDelaySeconds: 5, hardLimit: 100 },
} as const satisfies Record<string, ThrottlePolicy>;

/** Seconds an attempt must wait after the previous one, once `failures` have been counted. */
export function delaySeconds(failures: number, policy: ThrottlePolicy): number {
  if (failures < policy.free) return 0;
  return Math.min(2 ** (failures - policy.free), policy.maxDelaySeconds);
}

/**
 * The delay for every count up to the one where it stops growing (the last entry holds for all
 * larger counts): handed to the database, which applies it atomically while it counts.
 */
export function delayTable(policy: ThrottlePolicy): number[] {
  const out: number[] = [];
  for (let n = 0; ; n++) {
    out.push(delaySeconds(n, policy));
    if (out[n] === policy.maxDelaySeconds) return out;
  }
}
