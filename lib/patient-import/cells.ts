// Reading one cell of an imported file into a field value. Pure.
import { HIV_STATUS, RISK_GROUPS, SEX_AT_BIRTH } from "@/lib/domain/vocab";

// A cell a spreadsheet would run as a formula when the data is exported again and opened
// (OWASP, "CSV Injection": cells starting with = + - @, tab or carriage return). Such a value is
// refused rather than altered, so what is stored is always what the file said.
const FORMULA_START = /^[=+\-@\t\r]/;

export function formulaProblem(raw: string): string | null {
  const start = FORMULA_START.exec(raw) ?? FORMULA_START.exec(raw.trim());
  if (!start) return null;
  const shown = start[0] === "\t" ? "a tab" : start[0] === "\r" ? "a carriage return" : `"${start[0]}"`;
  return `Starts with ${shown}, which a spreadsheet would run as a formula. Remove the leading character.`;
}

type Read<T> = { value: T | undefined } | { error: string };

const key = (s: string) => s.trim().toLowerCase().replace(/[\s-]+/g, "_");

function lookup<T extends string>(words: Record<string, T>, allowed: readonly T[], what: string) {
  return (raw: string): Read<T> => {
    const k = key(raw);
    if (!k) return { value: undefined };
    const hit = words[k] ?? allowed.find((a) => a === k);
    return hit ? { value: hit } : { error: `"${raw.trim().slice(0, 40)}" is not a ${what}: use ${allowed.join(", ")}.` };
  };
}

export const readSexAtBirth = lookup<(typeof SEX_AT_BIRTH)[number]>({ f: "female", m: "male", u: "unknown" }, SEX_AT_BIRTH, "sex at birth");

export const readHivStatus = lookup<(typeof HIV_STATUS)[number]>(
  { pos: "positive", yes: "positive", y: "positive", neg: "negative", no: "negative", n: "negative", u: "unknown", not_known: "unknown" },
  HIV_STATUS,
  "HIV status",
);

/** Risk groups: several in one cell, separated by ; or |. Repeats count once. */
export function readRiskGroups(raw: string): Read<(typeof RISK_GROUPS)[number][]> {
  const parts = raw.split(/[;|]/).map(key).filter(Boolean);
  if (!parts.length) return { value: undefined };
  const out = new Set<(typeof RISK_GROUPS)[number]>();
  for (const p of parts) {
    const hit = RISK_GROUPS.find((g) => g === p);
    if (!hit) return { error: `"${p.slice(0, 40)}" is not a risk group: use ${RISK_GROUPS.join(", ")}, separated by ";".` };
    out.add(hit);
  }
  return { value: [...out].sort((a, b) => RISK_GROUPS.indexOf(a) - RISK_GROUPS.indexOf(b)) };
}

/** Free text: trimmed; an empty cell is no value. */
export function readText(raw: string): Read<string> {
  const t = raw.trim();
  return { value: t === "" ? undefined : t };
}
