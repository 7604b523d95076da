// Tokens for invitation and reset links: 32 random bytes, only a SHA-256 hash is stored, so a
// leaked table does not reveal a working link. Single use is enforced where the hash is consumed.
import { createHash, randomBytes } from "node:crypto";

/** Invitations live 72 hours; resets 1 hour (a reset link is a credential, keep it short). */
export const INVITATION_TTL_MS = 72 * 60 * 60 * 1000;
export const RESET_TTL_MS = 60 * 60 * 1000;

export interface IssuedToken {
  /** Goes into the e-mail link only. */
  token: string;
  /** Goes into the database only. */
  tokenHash: string;
}

export function issueToken(): IssuedToken {
  const token = randomBytes(32).toString("base64url");
  return { token, tokenHash: hashToken(token) };
}

export function hashToken(token: string): string {
  return createHash("sha256").update(token, "utf8").digest("hex");
}

/** A token from a URL: 32 bytes in base64url are exactly 43 characters of [A-Za-z0-9_-]. */
export function looksLikeToken(value: unknown): value is string {
  return typeof value === "string" && /^[A-Za-z0-9_-]{43}$/.test(value);
}

export function expiryFrom(now: Date, ttlMs: number): Date {
  return new Date(now.getTime() + ttlMs);
}
