import "server-only";
import { researchSql } from "../../replica";
import type { PatientBundleInput } from "@/lib/fhir";
import type { AinGrade, Grade, Histology, Modality, P16 } from "@/lib/domain/vocab";
import type { SexAtBirth } from "@/lib/deidentify";

// Everything lib/fhir needs for one patient in six queries, whatever the number of visits.
// Only signed visits are mapped (an Encounter is written as finished); `beforeDate` cuts the
// record at a study withdrawal.

export interface FhirLoadOptions {
  beforeDate?: string | null;
}

export async function loadPatientBundleInput(patientId: string, siteId: string, opts: FhirLoadOptions = {}): Promise<PatientBundleInput | null> {
  const sql = await researchSql();
  const before = opts.beforeDate ?? null;
  const [patient] = await sql<{ id: string; sex_at_birth: SexAtBirth; date_of_birth: string; given_name: string; family_name: string; mrn: string }[]>`
    SELECT id, sex_at_birth, to_char(date_of_birth, 'YYYY-MM-DD') AS date_of_birth, given_name, family_name, mrn
    FROM patients WHERE id = ${patientId} AND site_id = ${siteId}`;
  if (!patient) return null;
  const visits = await sql<{ id: string; date: string }[]>`
    SELECT id, to_char(visit_date, 'YYYY-MM-DD') AS date FROM visits
    WHERE patient_id = ${patientId} AND status = 'signed' AND (${before}::date IS NULL OR visit_date < ${before}::date)
    ORDER BY visit_date, created_at`;
  const visitIds = visits.map((v) => v.id);
  const none = visitIds.length === 0;
  const lesions = none ? [] : await sql<{ id: string; visit_id: string; track_id: string; grade: Grade }[]>`
    SELECT id, visit_id, track_id, grade FROM lesions WHERE visit_id IN ${sql(visitIds)} AND track_id IS NOT NULL`;
  // A track is placed where it was last seen among the mapped visits.
  const tracks = none ? [] : await sql<{ id: string; clock_start_h: number; clock_end_h: number; distance_start_cm: number; distance_end_cm: number }[]>`
    SELECT DISTINCT ON (l.track_id) l.track_id AS id, l.clock_start_h, l.clock_end_h, l.distance_start_cm, l.distance_end_cm
    FROM lesions l JOIN visits v ON v.id = l.visit_id
    WHERE l.visit_id IN ${sql(visitIds)} AND l.track_id IS NOT NULL
    ORDER BY l.track_id, v.visit_date DESC`;
  const biopsies = none ? [] : await sql<{ id: string; visit_id: string; lesion_id: string | null; track_id: string | null; histology: Histology | null; ain_grade: AinGrade | null; p16: P16 | null }[]>`
    SELECT b.id, b.visit_id, b.lesion_id, l.track_id, b.histology, b.ain_grade, b.p16
    FROM biopsies b LEFT JOIN lesions l ON l.id = b.lesion_id WHERE b.visit_id IN ${sql(visitIds)}`;
  const treatments = none ? [] : await sql<{ id: string; visit_id: string; modality: Modality; track_id: string | null }[]>`
    SELECT t.id, t.visit_id, t.modality, l.track_id
    FROM treatments t LEFT JOIN lesions l ON l.id = t.lesion_id WHERE t.visit_id IN ${sql(visitIds)}`;
  return {
    patient: { id: patient.id, sexAtBirth: patient.sex_at_birth, dateOfBirth: patient.date_of_birth, givenName: patient.given_name, familyName: patient.family_name, mrn: patient.mrn },
    visits: visits.map((v) => ({ id: v.id, date: v.date })),
    tracks: tracks.map((t) => ({ id: t.id, clockStart: t.clock_start_h, clockEnd: t.clock_end_h, distanceStartCm: t.distance_start_cm, distanceEndCm: t.distance_end_cm })),
    lesions: lesions.map((l) => ({ id: l.id, visitId: l.visit_id, trackId: l.track_id, grade: l.grade })),
    biopsies: biopsies.map((b) => ({
      id: b.id,
      visitId: b.visit_id,
      lesionId: b.lesion_id ?? undefined,
      trackId: b.track_id ?? undefined,
      histology: b.histology ?? undefined,
      ain: b.ain_grade ?? undefined,
      p16: b.p16 ?? undefined,
    })),
    treatments: treatments.map((t) => ({ id: t.id, visitId: t.visit_id, modality: t.modality, trackIds: t.track_id ? [t.track_id] : undefined })),
  };
}
