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
