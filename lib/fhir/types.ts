// Input to the FHIR mapping: plain registry objects, and the small slice of FHIR R4 we emit.
import type { AinGrade, Grade, Histology, Modality, P16 } from "@/lib/domain/vocab";
import type { SexAtBirth } from "@/lib/deidentify/deidentify-patient";

export interface BundlePatient {
  id: string;
  sexAtBirth: SexAtBirth;
  /** Full date of birth (identified mode). */
  dateOfBirth?: string;
  birthYear?: number;
  givenName?: string;
  familyName?: string;
  mrn?: string;
}

export interface BundleVisit {
  id: string;
  /** ISO date of the examination. */
  date: string;
}

/** A lesion followed across visits: where it sits in the stored frame. */
export interface BundleTrack {
  id: string;
  /** Lithotomy clock hours, decimal in [0, 12); 12 o'clock stored as 0. */
  clockStart: number;
  clockEnd: number;
  /** Distance from the anal verge: positive inside the canal, negative on perianal skin. */
  distanceStartCm: number;
  distanceEndCm?: number;
}

/** One sighting of a track at one visit. */
export interface BundleLesion {
  id: string;
  visitId: string;
  trackId: string;
  grade: Grade;
}

export interface BundleBiopsy {
  id: string;
  visitId: string;
  trackId?: string;
  lesionId?: string;
  /** Absent until pathology reports. */
  histology?: Histology;
  ain?: AinGrade;
  p16?: P16;
}

export interface BundleTreatment {
  id: string;
  visitId: string;
  modality: Modality;
  trackIds?: string[];
}

export interface PatientBundleInput {
  patient: BundlePatient;
  visits: BundleVisit[];
  tracks: BundleTrack[];
  lesions: BundleLesion[];
  biopsies?: BundleBiopsy[];
  treatments?: BundleTreatment[];
}

export interface BundleOptions {
  /**
   * Safe Harbor mode: no name, MRN or full dates; every date becomes its year, and the birth year
   * is left out for a patient over 89 at enrolment or on `asOfDate` (reportableBirthYear).
   */
  deidentified?: { studySubjectId: string; enrolmentDate: string; asOfDate?: string };
  /** Timestamp for Bundle.timestamp; passed in so the mapping stays pure. */
  timestamp?: string;
}

export interface Coding {
  system?: string;
  code?: string;
  display?: string;
}
export interface CodeableConcept {
  coding?: Coding[];
  text?: string;
}
export interface Reference {
  reference: string;
  type?: string;
}
export interface Extension {
  url: string;
  valueDecimal?: number;
  valueCode?: string;
  valueString?: string;
  valueReference?: Reference;
  valueQuantity?: { value: number; unit: string; system: string; code: string };
  extension?: Extension[];
}

/** Loose resource shape: each builder fills in what its resource type needs. */
export interface FhirResource {
  resourceType: string;
  id: string;
  extension?: Extension[];
  [element: string]: unknown;
}

export interface FhirBundle {
  resourceType: "Bundle";
  type: "collection";
  timestamp?: string;
  entry: { fullUrl: string; resource: FhirResource }[];
}
