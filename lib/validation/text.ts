import { z } from "zod";

// Every string a person types goes through text(): it refuses the characters that change how text
// is shown without being seen. Bidirectional embeddings, overrides and isolates (U+202A–U+202E,
// U+2066–U+2069; Unicode Standard Annex #9, and CVE-2021-42574 "Trojan Source" for how they
// disguise text) and the C0 controls and DEL (ISO/IEC 6429) other than tab, line feed and carriage
// return (a typed line break). Refused rather than stripped, so what is stored is what was typed.
export const UNSAFE_TEXT = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F\u202A-\u202E\u2066-\u2069]/;

export const UNSAFE_TEXT_MESSAGE = "Remove the invisible control or text-direction characters (pasted text can carry them).";

export function isSafeText(s: string): boolean {
  return !UNSAFE_TEXT.test(s);
}

/** z.string() for anything a person types: the same parameters, and unsafe characters refused. */
export function text(params?: Parameters<typeof z.string>[0]) {
  return z.string(params).refine(isSafeText, UNSAFE_TEXT_MESSAGE);
}

export const REASON_RULE = "Give the reason in words (at least 10 letters, in two words or more).";

/**
 * Why a typed reason says nothing (it is kept in the audit log beside a grave action), or null.
 * Refused: fewer than 10 letters, fewer than two words, or letters that are nearly all one character
 * ("..........", "aaaaaaaaaa", "x x x x x x"). Common practice, no source: a log entry must let a
 * reader understand the request later.
 */
export function reasonProblem(reason: string): string | null {
  const letters = reason.match(/\p{L}/gu) ?? [];
  const words = reason.match(/\p{L}{2,}/gu) ?? [];
  if (letters.length < 10 || words.length < 2) return REASON_RULE;
  if (new Set(letters.map((l) => l.toLowerCase())).size < 4) return REASON_RULE;
  return null;
}

/** A reason kept in the audit log beside a grave action (an identified export, a discarded visit). */
export const reasonSchema = text({ message: REASON_RULE }).trim().max(500, "Keep the reason under 500 characters.").superRefine((v, ctx) => {
  const problem = reasonProblem(v);
  if (problem) ctx.addIssue({ code: "custom", message: problem });
});
