// The part every research export shares: which enrolled patients and which of their visits.
// COPY takes no bind parameters, so the SQL text is assembled here from closed values only:
// uuids, calendar dates and enum members, each re-checked by `lit` right before it is quoted.
import { GRADES } from "@/lib/domain/vocab";
import type { ExportFilter } from "@/lib/validation/research";

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
const DAY = /^\d{4}-\d{2}-\d{2}$/;
const ENUM_WORD = /^[a-z_]+$/;

type LiteralKind = "uuid" | "date" | "grade";

/** A quoted SQL literal, only for values that cannot hold a quote, a backslash or a space. */
export function lit(value: string, kind: LiteralKind): string {
  const ok =
    kind === "uuid" ? UUID.test(value) : kind === "date" ? DAY.test(value) : ENUM_WORD.test(value) && (GRADES as readonly string[]).includes(value);
  if (!ok) throw new Error(`Refusing to put an unchecked ${kind} into SQL text`);
  return `'${value}'::${kind === "grade" ? "grade" : kind}`;
}

export interface ExportScope {
  filter: ExportFilter;
  /** Sites the caller may see (from the session, never from the request). */
  siteIds: string[];
}

export type DateStyle = "offset" | "year" | "identified";

export function dateStyle(f: ExportFilter): DateStyle {
  return f.identified ? "identified" : f.dates;
}

/**
 * A date column in the export's form: days since enrolment, the year alone, or (identified
 * export only) the date itself. `anchor` is the enrolment (consent) date column.
 */
export function dateColumn(expr: string, anchor: string, name: string, style: DateStyle): string {
  switch (style) {
    case "offset":
      return `dentate_day_offset(${expr}, ${anchor}) AS ${name}_day`;
    case "year":
      return `dentate_year_only(${expr}) AS ${name}_year`;
    case "identified":
      return `${expr} AS ${name}_date`;
  }
}

/**
 * CTEs `enr` (enrolments of the study at the caller's sites) and `vis` (their signed visits before
 * any withdrawal, numbered per patient, then cut to the date range). A draft visit may still
 * change, so only signed visits leave the clinic. Withdrawal: visits on or after the withdrawal
 * date are never exported.
 */
export function baseCtes({ filter, siteIds }: ExportScope): string {
  const sites = siteIds.length ? siteIds.map((id) => lit(id, "uuid")).join(", ") : null;
  const enrWhere = [
    `e.study_id = ${lit(filter.studyId, "uuid")}`,
    sites ? `e.site_id IN (${sites})` : "false",
    filter.siteId ? `e.site_id = ${lit(filter.siteId, "uuid")}` : null,
  ].filter(Boolean);
  const range = [
    filter.from ? `n.visit_date >= ${lit(filter.from, "date")}` : null,
    filter.to ? `n.visit_date <= ${lit(filter.to, "date")}` : null,
  ].filter(Boolean);
  return `enr AS (
  SELECT e.patient_id, e.site_id, e.study_subject_id, e.consent_date, e.withdrawn_on
  FROM enrolments e WHERE ${enrWhere.join(" AND ")}
), vis AS (
  SELECT n.* FROM (
    SELECT v.id, v.patient_id, v.visit_date, enr.study_subject_id, enr.consent_date,
      row_number() OVER (PARTITION BY v.patient_id ORDER BY v.visit_date, v.created_at) AS visit_seq
    FROM visits v JOIN enr ON enr.patient_id = v.patient_id AND enr.site_id = v.site_id
    WHERE v.status = 'signed' AND (enr.withdrawn_on IS NULL OR v.visit_date < enr.withdrawn_on)
  ) n${range.length ? ` WHERE ${range.join(" AND ")}` : ""}
)`;
}

/** Identity columns of the identified export (admin only, with a recorded reason). */
export const IDENTITY_COLUMNS = "p.mrn, p.family_name, p.given_name, p.date_of_birth";
