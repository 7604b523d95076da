// Password rules after NIST SP 800-63B-4 (2024), §3.1.1.2: a password that is the only factor
// must be at least 15 characters; at least 64 must be accepted; no composition rules; new
// passwords are checked against a list of commonly used values and context-specific words.
// Dentate has no second factor, so the 15-character floor applies.
import { COMMON_PASSWORDS_TEXT } from "./common-passwords";

export const PASSWORD_MIN_CHARS = 15;
/** We accept well beyond the 64 the standard asks for; the cap only guards the hasher. */
export const PASSWORD_MAX_CHARS = 256;

let common: ReadonlySet<string> | undefined;
function commonSet(): ReadonlySet<string> {
  common ??= new Set(COMMON_PASSWORDS_TEXT.split("\n"));
  return common;
}

/** Counted in Unicode code points, as the standard asks (an emoji is one character). */
export function passwordLength(password: string): number {
  return [...password].length;
}

export interface PasswordContext {
  email?: string;
  displayName?: string;
}

/** The first problem found, or null when the password is acceptable. */
export function passwordProblem(password: string, context: PasswordContext = {}): string | null {
  const length = passwordLength(password);
  if (length < PASSWORD_MIN_CHARS) return `Use at least ${PASSWORD_MIN_CHARS} characters. A few unrelated words make a long password easy to remember.`;
  if (length > PASSWORD_MAX_CHARS) return `Use at most ${PASSWORD_MAX_CHARS} characters.`;
  const lower = password.toLowerCase();
  if (isCommon(lower)) return "This password is on a list of commonly used passwords. Choose another.";
  if (/^(.)\1+$/u.test(password)) return "A single repeated character is too easy to guess.";
  for (const word of contextWords(context)) {
    if (lower.includes(word)) return "Do not use your name, your e-mail address or the name of this service in your password.";
  }
  return null;
}

function isCommon(lower: string): boolean {
  const set = commonSet();
  if (set.has(lower)) return true;
  // A listed password repeated ("passwordpassword") or padded with digits and symbols
  // ("baseball2024!!!!") is as weak as the listed one.
  const core = lower.replace(/[\d\W_]+$/u, "").replace(/^[\d\W_]+/u, "");
  if (core.length >= 8 && set.has(core)) return true;
  for (const size of [8, 9, 10, 11, 12]) {
    if (lower.length % size === 0 && lower.length > size) {
      const unit = lower.slice(0, size);
      if (unit.repeat(lower.length / size) === lower && set.has(unit)) return true;
    }
  }
  return false;
}

function contextWords(context: PasswordContext): string[] {
  const words = ["dentate"];
  const local = context.email?.split("@")[0]?.toLowerCase();
  if (local && local.length >= 4) words.push(local);
  for (const part of context.displayName?.toLowerCase().split(/[^\p{L}]+/u) ?? []) {
    if (part.length >= 4) words.push(part);
  }
  return words;
}
