import "server-only";
import { researchSql } from "../../replica";
import type { Grade } from "@/lib/domain/vocab";
import { exportFilterSchema } from "@/lib/validation/research";
import { baseCtes, type ExportScope } from "./export-scope";
import { outcomesSelect } from "./export-sql";

// The registry dashboard reads the same CTEs and outcome definitions as the exports, so a figure
// on screen and a figure in a statistician's file can never disagree. A lesion's effective grade is
// written as dentate_lesion_grade's body (migration 0010) so PostgreSQL can inline it: a function
// whose body holds a sub-select is called row by row, ten times slower over 200,000 lesions.

function scopeFor(studyId: string, siteIds: string[]): ExportScope {
  return { filter: exportFilterSchema.parse({ studyId }), siteIds };
}

/** The figures the study dashboard is made of, read with the exports' own CTEs and outcome definitions. */
export async function readDashboardRows(studyId: string, siteIds: string[]) {
  const sql = await researchSql();
  const scope = scopeFor(studyId, siteIds);
  const ctes = baseCtes(scope);
  const [totals] = await sql.unsafe<{ patients: number; visits: number; lesions: number }[]>(`WITH ${ctes}
    SELECT (SELECT count(*)::int FROM enr WHERE withdrawn_on IS NULL) AS patients,
      (SELECT count(*)::int FROM vis) AS visits,
      (SELECT count(*)::int FROM vis JOIN lesions l ON l.visit_id = vis.id) AS lesions`);
  const gradeRows = await sql.unsafe<{ quarter: string; grade: Grade; n: number }[]>(`WITH ${ctes}
    SELECT to_char(vis.visit_date, 'YYYY "Q"Q') AS quarter,
      dentate_effective_grade(l.grade, (SELECT max(b.histology) FROM biopsies b WHERE b.lesion_id = l.id)) AS grade, count(*)::int AS n
    FROM vis JOIN lesions l ON l.visit_id = vis.id GROUP BY 1, 2 ORDER BY 1`);
  // A treated lesion is followed when the patient has a later exported visit; cleared when its
  // track's status there is cleared or regressed (lib/tracking decided and stored it).
  const [lesionClear] = await sql.unsafe<{ followed: number; cleared: number }[]>(`WITH ${ctes}, nv AS (
      SELECT id, lead(id) OVER (PARTITION BY patient_id ORDER BY visit_seq) AS next_id FROM vis
    ), treated AS (
      SELECT DISTINCT l.track_id, nv.next_id FROM nv
      JOIN lesions l ON l.visit_id = nv.id JOIN treatments t ON (t.lesion_id = l.id OR l.id = ANY(t.treated_lesion_ids)) AND t.visit_id = nv.id
      WHERE l.track_id IS NOT NULL
    )
    SELECT count(*) FILTER (WHERE tr.next_id IS NOT NULL)::int AS followed,
      count(*) FILTER (WHERE ts.status IN ('cleared', 'regressed'))::int AS cleared
    FROM treated tr LEFT JOIN track_statuses ts ON ts.visit_id = tr.next_id AND ts.track_id = tr.track_id`);
  const outcomes = await sql.unsafe<{ first_treatment_day: number | null; days_treatment_to_clearance: number | null; days_clearance_to_recurrence_or_censor: number | null; recurrence: number | null; visits: number }[]>(
    outcomesSelect(scope),
  );
  const [patientFollow] = await sql.unsafe<{ followed: number }[]>(`WITH ${ctes}, pt AS (
      SELECT vis.patient_id, max(vis.visit_date) AS last_visit,
        min(vis.visit_date) FILTER (WHERE EXISTS (SELECT 1 FROM treatments t WHERE t.visit_id = vis.id)) AS first_treatment
      FROM vis GROUP BY vis.patient_id)
    SELECT count(*)::int AS followed FROM pt WHERE first_treatment < last_visit`);

  return { totals: totals!, gradeRows, lesionClear: lesionClear!, outcomes, patientFollow: patientFollow! };
}
