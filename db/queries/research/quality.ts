import "server-only";
import { researchSql } from "../../replica";
import { CYTOLOGY_CONFIRMATION_WINDOW_DAYS, type QualityVisit, type Severity } from "@/lib/quality";
import type { Cytology } from "@/lib/domain/vocab";
import type { SiteScope } from "../scope";

interface VisitRow {
  site_id: string;
  site_code: string;
  examiner_id: string;
  examiner_name: string;
  patient_id: string;
  visit_date: string;
  cytology: Cytology;
  duration_min: number | null;
  pain: Severity | null;
  bleeding: Severity | null;
  histology_hsil: boolean;
  cytology_confirmed: boolean | null;
}

/**
 * Signed visits of one calendar year at the caller's sites, in the shape lib/quality reads.
 * Cytological HSIL counts as confirmed when a biopsy of the same patient, from that visit or a signed
 * visit up to `windowDays` later, shows HSIL or worse (our reading: SCC confirms a high-grade
 * cytology too); unset while no histology is back within the window.
 */
export async function loadQualityVisits(scope: SiteScope, year: number, windowDays = CYTOLOGY_CONFIRMATION_WINDOW_DAYS): Promise<(QualityVisit & { siteId: string; siteCode: string; examinerName: string })[]> {
  if (scope.siteIds.length === 0) return [];
  const sql = await researchSql();
  // The cytology's own visit, or a signed visit of the same patient within the window after it.
  const later = sql`(bv.id = v.id OR (bv.patient_id = v.patient_id AND bv.status = 'signed'
    AND bv.visit_date >= v.visit_date AND bv.visit_date <= v.visit_date + ${windowDays}::int))`;
  const rows = await sql<VisitRow[]>`
    SELECT v.site_id, s.code AS site_code, v.examiner_id, u.display_name AS examiner_name, v.patient_id,
      to_char(v.visit_date, 'YYYY-MM-DD') AS visit_date, v.cytology,
      CASE WHEN v.exam_started_at IS NOT NULL AND v.exam_ended_at IS NOT NULL
        THEN extract(epoch FROM v.exam_ended_at - v.exam_started_at)::float8 / 60 END AS duration_min,
      (SELECT c.severity FROM complications c WHERE c.visit_id = v.id AND c.kind = 'pain' ORDER BY CASE c.severity WHEN 'severe' THEN 3 WHEN 'moderate' THEN 2 ELSE 1 END DESC LIMIT 1) AS pain,
      (SELECT c.severity FROM complications c WHERE c.visit_id = v.id AND c.kind = 'bleeding' ORDER BY CASE c.severity WHEN 'severe' THEN 3 WHEN 'moderate' THEN 2 ELSE 1 END DESC LIMIT 1) AS bleeding,
      EXISTS (SELECT 1 FROM biopsies b WHERE b.visit_id = v.id AND b.histology = 'hsil') AS histology_hsil,
      CASE WHEN v.cytology <> 'hsil' THEN NULL
        WHEN NOT EXISTS (SELECT 1 FROM biopsies b JOIN visits bv ON bv.id = b.visit_id WHERE ${later} AND b.histology IS NOT NULL) THEN NULL
        ELSE EXISTS (SELECT 1 FROM biopsies b JOIN visits bv ON bv.id = b.visit_id WHERE ${later} AND b.histology IN ('hsil', 'scc')) END AS cytology_confirmed
    FROM visits v JOIN sites s ON s.id = v.site_id JOIN users u ON u.id = v.examiner_id
    WHERE v.status = 'signed' AND v.site_id IN ${sql(scope.siteIds)}
      AND v.visit_date >= make_date(${year}, 1, 1) AND v.visit_date < make_date(${year + 1}, 1, 1)
    ORDER BY s.code, u.display_name`;
  return rows.map((r) => ({
    siteId: r.site_id,
    siteCode: r.site_code,
    examinerId: r.examiner_id,
    examinerName: r.examiner_name,
    patientId: r.patient_id,
    date: r.visit_date,
    cytology: r.cytology,
    durationMin: r.duration_min,
    pain: r.pain,
    bleeding: r.bleeding,
    histologyHsil: r.histology_hsil,
    cytologyHsilConfirmed: r.cytology_confirmed ?? undefined,
  }));
}

