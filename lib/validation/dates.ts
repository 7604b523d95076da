import { z } from "zod";

// The shared date rules of every form: a calendar day that exists, and for the dates of care
// (visits, exams) a day the record can hold: not before the patient was born and not more than
// a short margin after today (a clinic a time zone ahead, a visit entered just after midnight).
// A day the date library cannot step past (9999-12-31 + 1 day) must never be stored.

/** Days after today a visit or exam may be dated; DENTATE_VISIT_DAYS_AHEAD overrides on the server. */
export const VISIT_DAYS_AHEAD_DEFAULT = 1;
export function visitDaysAhead(): number {
  const raw = typeof process !== "undefined" ? process.env.DENTATE_VISIT_DAYS_AHEAD : undefined;
  const n = raw === undefined || raw === "" ? NaN : Number(raw);
  return Number.isInteger(n) && n >= 0 && n <= 366 ? n : VISIT_DAYS_AHEAD_DEFAULT;
}

/** The earliest year any stored date of care may have (no living patient was seen before it). */
export const EARLIEST_YEAR = 1900;

// Date.parse("2026-02-30") is a number (it rolls over to March 2nd) but PostgreSQL refuses the
// day: check that the day exists by a round trip through the UTC calendar.
export const isRealDay = (s: string) => {
  const [y, m, d] = s.split("-").map(Number) as [number, number, number];
  const t = new Date(Date.UTC(y, m - 1, d));
  return y >= 1 && t.getUTCFullYear() === y && t.getUTCMonth() === m - 1 && t.getUTCDate() === d;
};

const ISO_DAY = /^\d{4}-\d{2}-\d{2}$/;

/** A real calendar day written YYYY-MM-DD. */
export const isoDateSchema = (required = "Enter a date.") =>
  z.string({ message: required }).regex(ISO_DAY, "Use a date like 2026-03-14.").refine(isRealDay, "Not a real date.");

const todayUtc = (now: Date) => now.toISOString().slice(0, 10);
const plusDays = (day: string, n: number) => new Date(Date.parse(`${day}T00:00:00Z`) + n * 86_400_000).toISOString().slice(0, 10);

/** The latest day of care accepted now. */
export function latestCareDay(now: Date = new Date()): string {
  return plusDays(todayUtc(now), visitDaysAhead());
}

/**
 * Why a day of care (YYYY-MM-DD, or the date part of a timestamp) cannot be stored, or null.
 * `birthDate` is known only on the server; the forms check the other bounds.
 */
export function careDayProblem(day: string, opts: { birthDate?: string | null; now?: Date } = {}): string | null {
  const d = day.slice(0, 10);
  if (Number(d.slice(0, 4)) < EARLIEST_YEAR) return `A date of care cannot be before ${EARLIEST_YEAR}.`;
  const latest = latestCareDay(opts.now);
  if (d > latest) return `A date of care cannot be after ${latest}.`;
  if (opts.birthDate && d < opts.birthDate.slice(0, 10)) return "A date of care cannot be before the patient's date of birth.";
  return null;
}

/** A visit's date: a real day within the bounds of care (the birth bound is the service's). */
export const careDateSchema = (required = "Enter the visit date.") =>
  isoDateSchema(required).superRefine((v, ctx) => {
    if (!isRealDay(v)) return; // the calendar check has said so already
    const problem = careDayProblem(v);
    if (problem) ctx.addIssue({ code: "custom", message: problem });
  });

/** An exam time (ISO timestamp with offset) within the bounds of care. */
export const careDateTimeSchema = (message = "Enter a time of day.") =>
  z.iso.datetime({ offset: true, message }).superRefine((v, ctx) => {
    const t = Date.parse(v);
    if (Number.isNaN(t)) return; // the datetime check has said so already
    const problem = careDayProblem(new Date(t).toISOString());
    if (problem) ctx.addIssue({ code: "custom", message: problem });
  });
