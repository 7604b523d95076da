import "server-only";
import { createHash } from "node:crypto";
import { sql as dsql } from "drizzle-orm";
import { db } from "../../client";
import { enrolments } from "../../schema";
import type { SiteScope } from "../scope";

// A research nurse enrols patients without ever seeing a name or MRN. Consenting patients are
// offered by an opaque reference: the first 12 hex digits of a SHA-256 of the patient's random
// record key. The reference says nothing about the person, cannot be turned back into the key,
// and the clinic can read the same reference off its own records to tell the nurse whom to enrol.

const REF_SQL = dsql`left(encode(sha256(convert_to('dentate-ref:' || p.id::text, 'UTF8')), 'hex'), 12)`;

export function patientReference(patientId: string): string {
  return createHash("sha256").update(`dentate-ref:${patientId}`).digest("hex").slice(0, 12);
}

export interface EnrolmentCandidate {
  ref: string;
  siteId: string;
  siteCode: string;
  /** Year of the first visit (a year alone is not an identifier under Safe Harbor). */
  firstVisitYear: number | null;
  visits: number;
}

/** Patients at the study's sites (within scope) with a current consent to this study, not yet enrolled. */
export async function listEnrolmentCandidates(scope: SiteScope, studyId: string): Promise<EnrolmentCandidate[]> {
  if (scope.siteIds.length === 0) return [];
  const rows = await db.execute<{ ref: string; site_id: string; site_code: string; first_year: number | null; visits: number }>(dsql`
    SELECT ${REF_SQL} AS ref, p.site_id, s.code AS site_code,
      (SELECT extract(year FROM min(v.visit_date))::int FROM visits v WHERE v.patient_id = p.id) AS first_year,
      (SELECT count(*)::int FROM visits v WHERE v.patient_id = p.id) AS visits
    FROM patients p
    JOIN study_sites ss ON ss.site_id = p.site_id AND ss.study_id = ${studyId}
    JOIN sites s ON s.id = p.site_id
    WHERE EXISTS (SELECT 1 FROM research_consents rc WHERE rc.patient_id = p.id AND rc.study_id = ${studyId} AND rc.withdrawn_on IS NULL) AND p.site_id IN ${scope.siteIds}
      AND NOT EXISTS (SELECT 1 FROM enrolments e WHERE e.study_id = ${studyId} AND e.patient_id = p.id)
    ORDER BY s.code, ref`);
  return rows.map((r) => ({ ref: r.ref, siteId: r.site_id, siteCode: r.site_code, firstVisitYear: r.first_year, visits: r.visits }));
}

/** Resolves a pick-list reference back to the patient, only among the candidates of that site. */
export async function findCandidate(scope: SiteScope, studyId: string, siteId: string, ref: string): Promise<string | null> {
  if (!scope.siteIds.includes(siteId)) return null;
  const rows = await db.execute<{ id: string }>(dsql`
    SELECT p.id FROM patients p
    JOIN study_sites ss ON ss.site_id = p.site_id AND ss.study_id = ${studyId}
    WHERE p.site_id = ${siteId} AND EXISTS (SELECT 1 FROM research_consents rc WHERE rc.patient_id = p.id AND rc.study_id = ${studyId} AND rc.withdrawn_on IS NULL) AND ${REF_SQL} = ${ref}
      AND NOT EXISTS (SELECT 1 FROM enrolments e WHERE e.study_id = ${studyId} AND e.patient_id = p.id)`);
  return rows[0]?.id ?? null;
}

export async function subjectIdTaken(studyId: string, studySubjectId: string): Promise<boolean> {
  const rows = await db.execute(dsql`SELECT 1 FROM enrolments WHERE study_id = ${studyId} AND lower(study_subject_id) = lower(${studySubjectId})`);
  return rows.length > 0;
}

/** Whether the value is the MRN of a patient of the site, apart from case, spaces and punctuation. */
export async function subjectIdIsSiteMrn(siteId: string, studySubjectId: string): Promise<boolean> {
  const rows = await db.execute(
    dsql`SELECT 1 FROM patients WHERE site_id = ${siteId} AND regexp_replace(lower(mrn), '[^a-z0-9]', '', 'g') = regexp_replace(lower(${studySubjectId}), '[^a-z0-9]', '', 'g') LIMIT 1`,
  );
  return rows.length > 0;
}

export async function insertEnrolment(values: { studyId: string; patientId: string; siteId: string; studySubjectId: string; consentDate: string }) {
  const [row] = await db.insert(enrolments).values(values).returning({ id: enrolments.id });
  return row!.id;
}
