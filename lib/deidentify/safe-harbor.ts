// HIPAA Safe Harbor rules (45 CFR 164.514(b)(2)) as small pure functions.
// They are the specification the SQL exports must match, so they stay deliberately plain.
import { daysBetween, fullYearsBetween, toCalendarDate, type DateInput } from "@/lib/dates/calendar";

/**
 * 3-digit ZIP areas holding 20,000 people or fewer (2000 Census, HHS de-identification guidance):
 * these must be reported as "000".
 */
export const RESTRICTED_ZIP3 = [
  "036", "059", "063", "102", "203", "556", "692", "790", "821",
  "823", "830", "831", "878", "879", "884", "890", "893",
] as const;

const RESTRICTED = new Set<string>(RESTRICTED_ZIP3);
// Five digits, optionally followed by the ZIP+4 suffix.
const US_ZIP = /^(\d{3})\d{2}(?:-?\d{4})?$/;

/** First three digits of a US ZIP code, or "000" when the area is restricted or the input is not a ZIP. */
export function zip3(zip: string | null | undefined): string {
  const m = US_ZIP.exec((zip ?? "").trim());
  if (!m) return "000";
  return RESTRICTED.has(m[1]) ? "000" : m[1];
}

/** Oldest age that may be reported as a number; older ages collapse into one category. */
export const MAX_REPORTABLE_AGE = 89;
export const AGE_OVER_89 = "90+";

export function ageInYears(dob: DateInput, atDate: DateInput): number {
  const age = fullYearsBetween(dob, atDate);
  if (age < 0) throw new RangeError("atDate lies before the date of birth");
  return age;
}

/** Age as a string ("57"), or "90+" for anyone older than 89. */
export function ageCategory(dob: DateInput, atDate: DateInput): string {
  const age = ageInYears(dob, atDate);
  return age > MAX_REPORTABLE_AGE ? AGE_OVER_89 : String(age);
}

export function yearOnly(date: DateInput): number {
  return toCalendarDate(date).year;
}

/**
 * The birth year a de-identified record may carry, or null. 45 CFR 164.514(b)(2)(i)(C): every
 * element of a date, the year included, that indicates an age over 89 is aggregated into one
 * category, so the year is withheld when the patient is over 89 at enrolment or at the export date.
 * Every de-identified output (CSV, workbook, FHIR) uses this one rule; SQL mirrors it in
 * dentate_birth_year (db/migrations/0002_deidentify_functions.sql).
 */
export function reportableBirthYear(dob: DateInput, enrolledOn: DateInput, asOf?: DateInput): number | null {
  const overAt = (d: DateInput) => fullYearsBetween(dob, d) > MAX_REPORTABLE_AGE;
  if (overAt(enrolledOn) || (asOf !== undefined && overAt(asOf))) return null;
  return yearOnly(dob);
}

/** Whole days from the anchor (for example enrolment) to the date; negative before the anchor. */
export function dayOffset(date: DateInput, anchorDate: DateInput): number {
  return daysBetween(anchorDate, date);
}

export type DateMode = "offset" | "year";

export type DeidentifiedDate = { mode: "year"; year: number } | { mode: "offset"; dayOffset: number };

/** One date in the export's chosen form: the year alone, or days since the anchor. */
export function deidentifyDate(date: DateInput, anchorDate: DateInput, mode: DateMode): DeidentifiedDate {
  return mode === "year"
    ? { mode, year: yearOnly(date) }
    : { mode, dayOffset: dayOffset(date, anchorDate) };
}
