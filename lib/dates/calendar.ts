// Calendar arithmetic on plain dates. Registry dates are calendar days, not instants:
// working in UTC day numbers keeps a visit on the same day whatever the server's time zone.

export type DateInput = string | Date;

export interface CalendarDate {
  year: number;
  month: number; // 1-12
  day: number;
}

const ISO_DATE = /^(\d{4})-(\d{2})-(\d{2})(?:$|T)/;
const MS_PER_DAY = 86_400_000;

/** Accepts "YYYY-MM-DD", a full ISO timestamp (its date part is used) or a Date (its UTC date). */
export function toCalendarDate(input: DateInput): CalendarDate {
  if (input instanceof Date) {
    if (Number.isNaN(input.getTime())) throw new RangeError("Invalid date");
    return { year: input.getUTCFullYear(), month: input.getUTCMonth() + 1, day: input.getUTCDate() };
  }
  const m = ISO_DATE.exec(input.trim());
  if (!m) throw new RangeError(`Not an ISO date: ${input}`);
  const date = { year: Number(m[1]), month: Number(m[2]), day: Number(m[3]) };
  // Round-trip through Date.UTC to reject 2023-02-30 and the like.
  const check = new Date(Date.UTC(date.year, date.month - 1, date.day));
  if (check.getUTCMonth() + 1 !== date.month || check.getUTCDate() !== date.day) {
    throw new RangeError(`No such calendar day: ${input}`);
  }
  return date;
}

export function dayNumber(input: DateInput): number {
  const d = toCalendarDate(input);
  return Math.round(Date.UTC(d.year, d.month - 1, d.day) / MS_PER_DAY);
}

export function formatIsoDate(d: CalendarDate): string {
  const pad = (n: number, w: number) => String(n).padStart(w, "0");
  return `${pad(d.year, 4)}-${pad(d.month, 2)}-${pad(d.day, 2)}`;
}

/** Signed whole days from `from` to `to`. */
export function daysBetween(from: DateInput, to: DateInput): number {
  return dayNumber(to) - dayNumber(from);
}

/** Completed years of age: the birthday must have been reached (a 29 February birthday is reached on 1 March). */
export function fullYearsBetween(from: DateInput, to: DateInput): number {
  const a = toCalendarDate(from);
  const b = toCalendarDate(to);
  let years = b.year - a.year;
  if (b.month < a.month || (b.month === a.month && b.day < a.day)) years -= 1;
  return years;
}

/** Adds calendar months, clamping to the month's last day (31 January + 1 month = 28/29 February). */
export function addMonths(input: DateInput, months: number): string {
  if (!Number.isInteger(months)) throw new RangeError("months must be an integer");
  const d = toCalendarDate(input);
  const index = d.year * 12 + (d.month - 1) + months;
  const year = Math.floor(index / 12);
  const month = (index % 12) + 1;
  const lastDay = new Date(Date.UTC(year, month, 0)).getUTCDate();
  return formatIsoDate({ year, month, day: Math.min(d.day, lastDay) });
}

export function addYears(input: DateInput, years: number): string {
  return addMonths(input, years * 12);
}

/**
 * The date `years` after `input`, with a 29 February date falling on 1 March in common years,
 * so that it agrees with fullYearsBetween (the day the completed-year count changes).
 */
export function anniversary(input: DateInput, years: number): string {
  const d = toCalendarDate(input);
  if (d.month === 2 && d.day === 29) {
    const leap = new Date(Date.UTC(d.year + years, 1, 29)).getUTCMonth() === 1;
    if (!leap) return formatIsoDate({ year: d.year + years, month: 3, day: 1 });
  }
  return addYears(input, years);
}

export function isoDate(input: DateInput): string {
  return formatIsoDate(toCalendarDate(input));
}
