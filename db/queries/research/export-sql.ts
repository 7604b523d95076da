// The three research exports as single SELECT statements. De-identification happens here, in
// SQL (db/migrations/0002_deidentify_functions.sql), so rows can stream out of PostgreSQL with COPY and no row ever
// passes through JavaScript. Identified columns appear only when the filter asks for them, which
// the route allows for admins with a reason.
import { researchSql } from "../../replica";
import { GRADES, HISTOLOGY, TRACK_STATUSES } from "@/lib/domain/vocab";
import type { ExportDataset } from "@/lib/validation/research";
import { IDENTITY_COLUMNS, baseCtes, dateColumn, dateStyle, lit, type ExportScope } from "./export-scope";

/**
 * Lesions counted per visit: by impression grade, by worst histology, treated, and tracks by status.
 * treated_fraction: every treatment row of a visit carries the union of the visit's treated arcs
 * (stampVisitTreatedFraction), so the visit's figure is any row's, never their sum.
 */
export function countsSelect(scope: ExportScope): string {
  const style = dateStyle(scope.filter);
  const grade = scope.filter.grade;
  const byGrade = GRADES.map((g) => `count(l.id) FILTER (WHERE l.grade = '${g}') AS impression_${g}`);
  const byHistology = HISTOLOGY.map((h) => `count(l.id) FILTER (WHERE b.histology = '${h}') AS histology_${h}`);
  const byStatus = TRACK_STATUSES.map((s) => `max(st.n_${s}) AS tracks_${s}`);
  const statusCounts = TRACK_STATUSES.map((s) => `count(*) FILTER (WHERE ts.status = '${s}') AS n_${s}`);
  return `WITH ${baseCtes(scope)}
SELECT vis.study_subject_id AS study_id${style === "identified" ? ", p.mrn" : ""}, vis.visit_seq,
  ${dateColumn("vis.visit_date", "vis.consent_date", "visit", style)},
  count(l.id) AS lesions,
  ${byGrade.join(",\n  ")},
  ${byHistology.join(",\n  ")},
  count(l.id) FILTER (WHERE tr.treated) AS lesions_treated,
  max(tf.fraction) AS treated_fraction,
  ${byStatus.join(",\n  ")}
FROM vis
${style === "identified" ? "JOIN patients p ON p.id = vis.patient_id" : ""}
LEFT JOIN lesions l ON l.visit_id = vis.id
LEFT JOIN LATERAL (SELECT max(x.histology) AS histology FROM biopsies x WHERE x.lesion_id = l.id) b ON true
LEFT JOIN LATERAL (SELECT true AS treated FROM treatments t WHERE t.visit_id = l.visit_id AND (t.lesion_id = l.id OR l.id = ANY(t.treated_lesion_ids)) LIMIT 1) tr ON true
LEFT JOIN LATERAL (SELECT round(coalesce(max(t.treated_fraction), 0)::numeric, 3) AS fraction FROM treatments t WHERE t.visit_id = vis.id) tf ON true
LEFT JOIN LATERAL (SELECT ${statusCounts.join(", ")} FROM track_statuses ts WHERE ts.visit_id = vis.id) st ON true
${grade ? `WHERE EXISTS (SELECT 1 FROM lesions g WHERE g.visit_id = vis.id AND g.grade = ${lit(grade, "grade")})` : ""}
GROUP BY vis.id, vis.study_subject_id, vis.visit_seq, vis.visit_date, vis.consent_date${style === "identified" ? ", p.mrn" : ""}
ORDER BY 1, ${style === "identified" ? 3 : 2}`;
}

/** One row per lesion, located in the stored frame, with its worst histology, treatment and track status. */
export function lesionsSelect(scope: ExportScope): string {
  const style = dateStyle(scope.filter);
  const grade = scope.filter.grade;
  return `WITH ${baseCtes(scope)}
SELECT vis.study_subject_id AS study_id${style === "identified" ? ", p.mrn" : ""},
  vis.study_subject_id || '-' || coalesce(lt.label, 'untracked') AS track_id,
  vis.visit_seq, ${dateColumn("vis.visit_date", "vis.consent_date", "visit", style)},
  l.clock_start_h, l.clock_end_h, l.distance_start_cm, l.distance_end_cm, l.zone, l.grade, l.morphology,
  l.acetowhite, l.lugol, array_to_string(l.vessels, ';') AS vessels, l.size_mm,
  b.histology AS biopsy_histology, tr.modalities AS treatment_modality, ts.status AS track_status
FROM vis
${style === "identified" ? "JOIN patients p ON p.id = vis.patient_id" : ""}
JOIN lesions l ON l.visit_id = vis.id
LEFT JOIN lesion_tracks lt ON lt.id = l.track_id
LEFT JOIN LATERAL (SELECT max(x.histology) AS histology FROM biopsies x WHERE x.lesion_id = l.id) b ON true
LEFT JOIN LATERAL (SELECT string_agg(DISTINCT t.modality::text, ';') AS modalities FROM treatments t WHERE t.visit_id = l.visit_id AND (t.lesion_id = l.id OR l.id = ANY(t.treated_lesion_ids))) tr ON true
LEFT JOIN track_statuses ts ON ts.track_id = l.track_id AND ts.visit_id = l.visit_id
${grade ? `WHERE l.grade = ${lit(grade, "grade")}` : ""}
ORDER BY vis.study_subject_id, vis.visit_seq, l.label`;
}

/**
 * Per patient: first HSIL, treatments, clearance, recurrence and progression.
 * - HSIL or worse at a visit: a lesion whose effective grade is HSIL or worse, where histology, when
 *   there is one, overrides the impression (dentate_lesion_grade, db/migrations/0010_effective_grade.sql;
 *   the same rule as lib/tracking/effective-grade.ts).
 * - Clearance: the first visit after the first treatment with no HSIL or worse, where no earlier
 *   track was marked not examined (a visit that left a known site unexamined clears nothing).
 * - Recurrence (column recurrence): HSIL or worse at any visit after a clear visit, at the treated
 *   site or elsewhere alike; censored at the last exported visit.
 * - Overall recurrence (column hsil_after_treatment): HSIL or worse at any visit after the first
 *   treatment, cleared in between or not = persistent + metachronous (Liu, Sigel & Gaisa,
 *   Papillomavirus Research 2018;5:S9). lib/exports/data-dictionary.ts words every column.
 * - Progression: a lesion whose effective grade is the top tier: SCC on histology, or suspected cancer
 *   at the exam with no histology yet (benign histology of a suspected cancer does not count).
 */
export function outcomesSelect(scope: ExportScope): string {
  const style = dateStyle(scope.filter);
  const grade = scope.filter.grade;
  const d = (expr: string, name: string) => dateColumn(expr, "enr.consent_date", name, style);
  const person =
    style === "identified"
      ? `${IDENTITY_COLUMNS}, p.zip, p.sex_at_birth, p.hiv_status, array_to_string(p.risk_groups, ';') AS risk_groups, enr.consent_date AS enrolment_date`
      : `dentate_birth_year(p.date_of_birth, enr.consent_date, current_date) AS birth_year,
  dentate_age_category(p.date_of_birth, enr.consent_date) AS age_at_enrolment,
  p.sex_at_birth, p.hiv_status, array_to_string(p.risk_groups, ';') AS risk_groups, dentate_zip3(p.zip) AS zip3${style === "year" ? ",\n  dentate_year_only(enr.consent_date) AS enrolment_year" : ""}`;
  // Per visit, set-based: each lesion's effective grade once (its worst histology over the
  // impression, dentate_effective_grade), then per visit whether any is HSIL or worse / cancer.
  return `WITH ${baseCtes(scope)}, lg AS (
  SELECT l.visit_id, dentate_effective_grade(l.grade, (SELECT max(b.histology) FROM biopsies b WHERE b.lesion_id = l.id)) AS g
  FROM vis JOIN lesions l ON l.visit_id = vis.id
), vg AS (
  SELECT visit_id, bool_or(dentate_grade_tier(g) >= dentate_grade_tier('hsil')) AS hsil_plus,
    bool_or(g = 'suspected_cancer') AS cancer
  FROM lg GROUP BY visit_id
), vt AS (
  SELECT t.visit_id, count(*) AS n FROM vis JOIN treatments t ON t.visit_id = vis.id GROUP BY t.visit_id
), vx AS (
  SELECT DISTINCT c.visit_id FROM vis JOIN track_checks c ON c.visit_id = vis.id AND c.outcome = 'not_examined'
), pv AS (
  SELECT vis.patient_id, vis.visit_date, coalesce(vg.hsil_plus, false) AS hsil_plus, coalesce(vg.cancer, false) AS cancer,
    coalesce(vt.n, 0) AS n_treatments, vx.visit_id IS NOT NULL AS part_unexamined
  FROM vis LEFT JOIN vg ON vg.visit_id = vis.id LEFT JOIN vt ON vt.visit_id = vis.id LEFT JOIN vx ON vx.visit_id = vis.id
), firsts AS (
  SELECT patient_id, count(*) AS visits, max(visit_date) AS last_visit,
    min(visit_date) FILTER (WHERE hsil_plus) AS first_hsil,
    min(visit_date) FILTER (WHERE n_treatments > 0) AS first_treatment,
    sum(n_treatments) AS treatments,
    min(visit_date) FILTER (WHERE cancer) AS first_cancer
  FROM pv GROUP BY patient_id
), cleared AS (
  SELECT f.patient_id, min(pv.visit_date) AS cleared_on FROM firsts f
  JOIN pv ON pv.patient_id = f.patient_id AND pv.visit_date > f.first_treatment AND NOT pv.hsil_plus AND NOT pv.part_unexamined
  GROUP BY f.patient_id
), after_tx AS (
  SELECT f.patient_id, min(pv.visit_date) AS hsil_on FROM firsts f
  JOIN pv ON pv.patient_id = f.patient_id AND pv.visit_date > f.first_treatment AND pv.hsil_plus
  GROUP BY f.patient_id
), recurred AS (
  SELECT c.patient_id, min(pv.visit_date) AS recurred_on FROM cleared c
  JOIN pv ON pv.patient_id = c.patient_id AND pv.visit_date > c.cleared_on AND pv.hsil_plus
  GROUP BY c.patient_id
)
SELECT enr.study_subject_id AS study_id, ${person},
  f.visits, ${d("f.first_hsil", "first_hsil")}, f.treatments, ${d("f.first_treatment", "first_treatment")},
  CASE WHEN c.cleared_on IS NULL THEN NULL ELSE c.cleared_on - f.first_treatment END AS days_treatment_to_clearance,
  CASE WHEN c.cleared_on IS NULL THEN NULL ELSE coalesce(r.recurred_on, f.last_visit) - c.cleared_on END AS days_clearance_to_recurrence_or_censor,
  CASE WHEN c.cleared_on IS NULL THEN NULL WHEN r.recurred_on IS NULL THEN 0 ELSE 1 END AS recurrence,
  CASE WHEN f.first_treatment IS NULL THEN NULL WHEN a.hsil_on IS NULL THEN 0 ELSE 1 END AS hsil_after_treatment,
  CASE WHEN f.first_cancer IS NULL THEN 0 ELSE 1 END AS progressed_to_cancer, ${d("f.first_cancer", "cancer")}
FROM enr
JOIN patients p ON p.id = enr.patient_id
JOIN firsts f ON f.patient_id = enr.patient_id
LEFT JOIN cleared c ON c.patient_id = enr.patient_id
LEFT JOIN recurred r ON r.patient_id = enr.patient_id
LEFT JOIN after_tx a ON a.patient_id = enr.patient_id
${grade ? `WHERE EXISTS (SELECT 1 FROM vis JOIN lesions g ON g.visit_id = vis.id WHERE vis.patient_id = enr.patient_id AND g.grade = ${lit(grade, "grade")})` : ""}
ORDER BY enr.study_subject_id`;
}

export function exportSelect(dataset: ExportDataset, scope: ExportScope): string {
  return dataset === "counts" ? countsSelect(scope) : dataset === "lesions" ? lesionsSelect(scope) : outcomesSelect(scope);
}

/**
 * One dataset as CSV straight out of PostgreSQL: COPY … TO STDOUT (FORMAT csv, HEADER) quotes
 * fields the RFC 4180 way and writes UTF-8; Node only forwards the bytes.
 */
export async function exportCsvCopy(dataset: ExportDataset, scope: ExportScope) {
  const sql = await researchSql();
  return sql.unsafe(`COPY (${exportSelect(dataset, scope)}) TO STDOUT WITH (FORMAT csv, HEADER, ENCODING 'UTF8')`).readable();
}

/** The same rows in batches of 500, for writers that need values (the workbook). */
export async function* exportRowCursor(dataset: ExportDataset, scope: ExportScope): AsyncGenerator<Record<string, unknown>[]> {
  const sql = await researchSql();
  yield* sql.unsafe<Record<string, unknown>[]>(exportSelect(dataset, scope)).cursor(500);
}
