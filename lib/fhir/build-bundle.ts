// One patient's registry record as a FHIR R4 collection Bundle. Entries use urn:uuid fullUrls
// so the bundle is self-contained: references resolve inside it, no server ids needed.
import { reportableBirthYear, yearOnly } from "@/lib/deidentify/safe-harbor";
import { buildBodyStructure } from "./body-structure";
import {
  buildBiopsyProcedure,
  buildHistology,
  buildLesionObservation,
  buildTreatmentProcedure,
  type MappingContext,
} from "./clinical-resources";
import { BIRTH_SEX_EXTENSION, PATIENT_ID_SYSTEM, STUDY_ID_SYSTEM, V3_ACT_CODE } from "./terminology";
import type { BundleOptions, BundlePatient, FhirBundle, FhirResource, PatientBundleInput, Reference } from "./types";
import { resourceUuid } from "./uuid";

const BIRTH_SEX_CODE = { female: "F", male: "M", intersex: "UNK", unknown: "UNK" } as const;

/** Drops undefined members so optional elements are absent rather than present-but-empty. */
function compact<T>(value: T): T {
  if (Array.isArray(value)) return value.map(compact) as T;
  if (value && typeof value === "object") {
    const out: Record<string, unknown> = {};
    for (const [k, v] of Object.entries(value)) if (v !== undefined) out[k] = compact(v);
    return out as T;
  }
  return value;
}

function buildPatient(patient: BundlePatient, id: string, options: BundleOptions): FhirResource {
  const birthSex = { url: BIRTH_SEX_EXTENSION, valueCode: BIRTH_SEX_CODE[patient.sexAtBirth] };
  if (options.deidentified) {
    const { enrolmentDate, asOfDate } = options.deidentified;
    // Safe Harbor: the one rule shared with the CSV and workbook exports (over 89: no year at all).
    const birthYear = patient.dateOfBirth
      ? (reportableBirthYear(patient.dateOfBirth, enrolmentDate, asOfDate) ?? undefined)
      : undefined;
    return {
      resourceType: "Patient",
      id,
      extension: [birthSex],
      identifier: [{ system: STUDY_ID_SYSTEM, value: options.deidentified.studySubjectId }],
      birthDate: birthYear === undefined ? undefined : String(birthYear),
    };
  }
  const named = patient.familyName || patient.givenName;
  return {
    resourceType: "Patient",
    id,
    extension: [birthSex],
    identifier: patient.mrn ? [{ system: PATIENT_ID_SYSTEM, value: patient.mrn }] : undefined,
    name: named ? [{ family: patient.familyName, given: patient.givenName ? [patient.givenName] : undefined }] : undefined,
    birthDate: patient.dateOfBirth ?? (patient.birthYear === undefined ? undefined : String(patient.birthYear)),
  };
}

/**
 * Builds Patient, one Encounter per visit, one BodyStructure per track, one Observation per
 * lesion, a Procedure per biopsy and per treatment, and an Observation plus DiagnosticReport for
 * each reported histology. In de-identified mode every date is cut to its year (FHIR allows a
 * year-only date) and the patient carries only the study subject id.
 */
export function buildPatientBundle(input: PatientBundleInput, options: BundleOptions = {}): FhirBundle {
  // The study subject id, not the registry key, seeds the ids of a de-identified bundle:
  // the same key would otherwise link the export back to the clinic's records.
  const seed = options.deidentified ? `study:${options.deidentified.studySubjectId}` : input.patient.id;
  const uuid = (kind: string, id: string) => resourceUuid(kind, `${seed}/${id}`);
  const ref = (kind: string, id: string): Reference => ({ reference: `urn:uuid:${uuid(kind, id)}`, type: kind });
  const visitDates = new Map(input.visits.map((v) => [v.id, v.date]));
  const tracks = new Map(input.tracks.map((t) => [t.id, t]));

  const ctx: MappingContext = {
    ref,
    uuid,
    patient: ref("Patient", input.patient.id),
    date: (iso) => (options.deidentified ? String(yearOnly(iso)) : iso),
    visitDate: (visitId) => {
      const date = visitDates.get(visitId);
      if (!date) throw new Error(`Unknown visit ${visitId}`);
      return date;
    },
    track: (trackId) => tracks.get(trackId),
  };
  for (const lesion of input.lesions) {
    if (!tracks.has(lesion.trackId)) throw new Error(`Lesion ${lesion.id} refers to unknown track ${lesion.trackId}`);
  }

  const resources: FhirResource[] = [
    buildPatient(input.patient, uuid("Patient", input.patient.id), options),
    ...input.visits.map((visit) => ({
      resourceType: "Encounter",
      id: uuid("Encounter", visit.id),
      status: "finished",
      class: { system: V3_ACT_CODE, code: "AMB", display: "ambulatory" },
      type: [{ text: "High-resolution anoscopy" }],
      subject: ctx.patient,
      period: { start: ctx.date(visit.date) },
    })),
    ...input.tracks.map((track) => buildBodyStructure(track, uuid("BodyStructure", track.id), ctx.patient)),
    ...input.lesions.map((lesion) => buildLesionObservation(lesion, ctx)),
    ...(input.biopsies ?? []).flatMap((b) => [buildBiopsyProcedure(b, ctx), ...buildHistology(b, ctx)]),
    ...(input.treatments ?? []).map((t) => buildTreatmentProcedure(t, ctx)),
  ];

  return compact({
    resourceType: "Bundle",
    type: "collection",
    timestamp: options.timestamp,
    entry: resources.map((resource) => ({ fullUrl: `urn:uuid:${resource.id}`, resource })),
  });
}
