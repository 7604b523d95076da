// Who may call which route: the one table the route × role matrix is generated from. Every handler
// under app/api must appear here with exactly the roles its route() declares; a route missing from
// this table, or declaring other roles, fails quality-access-matrix.test.ts. Opening a route to a
// role therefore takes two deliberate edits (the route and this table), never one by accident.
// Least privilege, deny by default: OWASP ASVS 4.0.3 V4.1.3.
//
// The research nurse works with de-identified study data only (studies, enrolments, exports): no
// identified visit read (exact dates, examiner, free text, patient id) is open to that role.
import type { Role } from "@/lib/domain/vocab";

export type Access = readonly Role[] | "any" | "public";

const CLINICAL = ["clinician", "reviewer", "admin"] as const;
const RESEARCH = ["research_nurse", "admin"] as const;

export const ACCESS: Record<string, Access> = {
  "DELETE /api/admin/invitations/[invitationId]": ["admin"],
  "DELETE /api/attachments/[attachmentId]": ["clinician"],
  "DELETE /api/biopsies/[biopsyId]": ["clinician"],
  "DELETE /api/visits/[visitId]/anaesthetic/[doseId]": ["clinician"],
  "DELETE /api/visits/[visitId]/complications/[id]": ["clinician"],
  "DELETE /api/visits/[visitId]/diagnoses": ["clinician"],
  "DELETE /api/visits/[visitId]/lesions/[lesionId]": ["clinician"],
  "DELETE /api/visits/[visitId]/treatments/[treatmentId]": ["clinician"],
  "GET /api/admin/followup-rules": ["admin"],
  "GET /api/admin/invitations": ["admin"],
  "GET /api/admin/sites": ["admin"],
  "GET /api/attachments/[attachmentId]": ["clinician", "reviewer"],
  "GET /api/biopsies/awaiting": ["clinician", "admin"],
  "GET /api/exports/[dataset]": RESEARCH,
  // An identified export: only from the export form (POST), only by an administrator.
  "POST /api/exports/[dataset]": ["admin"],
  "POST /api/exports/workbook": ["admin"],
  "GET /api/exports/workbook": RESEARCH,
  "GET /api/me/preferences": "any",
  // The benchmark's write floor: any signed-in user; it reads and changes no record.
  "POST /api/bench/write-floor": "any",
  "GET /api/patients": CLINICAL,
  "GET /api/patients/[patientId]": CLINICAL,
  "GET /api/patients/[patientId]/fhir": CLINICAL,
  "GET /api/patients/[patientId]/reviews": CLINICAL,
  "GET /api/patients/[patientId]/timeline": CLINICAL,
  "GET /api/reviews/[reviewId]": CLINICAL,
  "GET /api/studies/[studyId]": RESEARCH,
  "GET /api/studies/[studyId]/subjects/[subjectId]/fhir": RESEARCH,
  "GET /api/visits/[visitId]": CLINICAL,
  // A draft started by mistake: its examiner (a clinician) or an administrator; the service checks which.
  "POST /api/visits/[visitId]/discard": ["clinician", "admin"],
  "GET /api/visits/[visitId]/addenda": CLINICAL,
  "GET /api/visits/[visitId]/anaesthetic": CLINICAL,
  "GET /api/visits/[visitId]/attachments": ["clinician", "reviewer"],
  "GET /api/visits/[visitId]/biopsies": CLINICAL,
  "GET /api/visits/[visitId]/complications": CLINICAL,
  "GET /api/visits/[visitId]/diagnoses": CLINICAL,
  "GET /api/visits/[visitId]/lesions": CLINICAL,
  "GET /api/visits/[visitId]/report": ["clinician", "reviewer"],
  "GET /api/visits/[visitId]/tracks": CLINICAL,
  "GET /api/visits/[visitId]/treatments": CLINICAL,
  "PATCH /api/admin/sites/[siteId]": ["admin"],
  "PATCH /api/admin/users/[userId]": ["admin"],
  "PATCH /api/biopsies/[biopsyId]": ["clinician"],
  "PATCH /api/me/preferences": "any",
  "PATCH /api/patients/[patientId]": ["clinician", "admin"],
  "PATCH /api/patients/[patientId]/consents/[consentId]": ["clinician", "admin"],
  "PATCH /api/studies/[studyId]": RESEARCH,
  "PATCH /api/studies/[studyId]/enrolments/[enrolmentId]": RESEARCH,
  "PATCH /api/visits/[visitId]": ["clinician"],
  "PATCH /api/visits/[visitId]/lesions/[lesionId]": ["clinician"],
  "POST /api/adjudications/[adjudicationId]/resolve": ["clinician", "admin"],
  "POST /api/admin/invitations": ["admin"],
  "POST /api/admin/invitations/[invitationId]/resend": ["admin"],
  "POST /api/admin/sites": ["admin"],
  // The benchmark floor: constant JSON, no session, no database (app/api/ping/route.ts).
  "GET /api/ping": "public",
  "POST /api/auth/accept-invite": "public",
  "POST /api/auth/forgot-password": "public",
  "POST /api/auth/reset-password": "public",
  "POST /api/patients": ["clinician", "admin"],
  "POST /api/patients/[patientId]/consents": ["clinician", "admin"],
  "POST /api/patients/[patientId]/reviews": CLINICAL,
  "POST /api/patients/[patientId]/visits": ["clinician"],
  "POST /api/patients/import": ["clinician", "admin"],
  "POST /api/patients/import/check": ["clinician", "admin"],
  "POST /api/reviews/[reviewId]/sign-off": ["reviewer"],
  "POST /api/studies": RESEARCH,
  "POST /api/studies/[studyId]/enrolments": RESEARCH,
  "POST /api/visits/[visitId]/addenda": ["clinician", "admin"],
  "POST /api/visits/[visitId]/anaesthetic": ["clinician"],
  "POST /api/visits/[visitId]/attachments": ["clinician"],
  "POST /api/visits/[visitId]/biopsies": ["clinician"],
  "POST /api/visits/[visitId]/complications": ["clinician"],
  "POST /api/visits/[visitId]/diagnoses": ["clinician"],
  "POST /api/visits/[visitId]/lesions": ["clinician"],
  "POST /api/visits/[visitId]/sign": ["clinician", "admin"],
  "POST /api/visits/[visitId]/tracks": ["clinician"],
  "POST /api/visits/[visitId]/treatments": ["clinician"],
  "PUT /api/admin/followup-rules": ["admin"],
  "PUT /api/admin/users/[userId]/sites": ["admin"],
  "PUT /api/reviews/[reviewId]/adjudications": ["reviewer"],
};
