// Every API address the screens fetch or write, in one place: an SWR key written here is the
// same string everywhere it is read, revalidated or mutated.
export const api = {
  preferences: "/api/me/preferences",
  patients: "/api/patients",
  patient: (patientId: string) => `/api/patients/${patientId}`,
  patientVisits: (patientId: string) => `/api/patients/${patientId}/visits`,
  patientReviews: (patientId: string) => `/api/patients/${patientId}/reviews`,
  timeline: (patientId: string) => `/api/patients/${patientId}/timeline`,
  visit: (visitId: string) => `/api/visits/${visitId}`,
  visitPart: (visitId: string, part: "lesions" | "tracks" | "treatments" | "anaesthetic" | "complications" | "diagnoses" | "addenda" | "biopsies" | "attachments" | "sign") =>
    `/api/visits/${visitId}/${part}`,
  attachment: (attachmentId: string) => `/api/attachments/${attachmentId}`,
  biopsy: (biopsyId: string) => `/api/biopsies/${biopsyId}`,
  review: (reviewId: string) => `/api/reviews/${reviewId}`,
  resolveAdjudication: (adjudicationId: string) => `/api/adjudications/${adjudicationId}/resolve`,
  studyEnrolments: (studyId: string) => `/api/studies/${studyId}/enrolments`,
  patientImportCheck: "/api/patients/import/check",
  patientImport: "/api/patients/import",
} as const;
