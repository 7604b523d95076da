// For each route: what a well-formed request addressing site A's records looks like. The
// access matrix needs it so that a refusal is about access, not about a malformed body (a
// handler may parse the body before it looks the record up). A mutating route missing from
// this table fails the matrix: add its minimal body here.
import { randomUUID } from "node:crypto";
import { patientReference } from "@/db/queries/research/enrolment";
import type { World } from "./fixture-world";
import { ACCESS } from "./access-table";

export interface RequestSpec {
  /** Parameter values that differ from paramsFor() (e.g. a signed visit). */
  params?: (w: World) => Record<string, string>;
  query?: (w: World) => string;
  /** A valid JSON body, or "none" for routes that read no body. */
  body?: ((w: World) => unknown) | "none" | "multipart";
  /** Why the right-role success check is not made here (covered elsewhere). */
  skipRightRole?: string;
  /** The route addresses no site record (a list scoped to the caller, or the caller's own settings):
   *  no 404 check; reads by site B are checked for leaks of site A's ids, and changes to the
   *  caller's own settings are not made by site B (they would succeed, as they should). */
  noSiteRecord?: string;
}

// One invented patient with an MRN of its own, in a file as a clinic would export it.
const importCsv = () => `MRN,Family name,Given name,Date of birth,Sex at birth\nQ-${randomUUID().slice(0, 8)},Invented,Pat,1970-01-01,F\n`;

export const SPECS: Record<string, RequestSpec> = {
  "GET /api/patients": { noSiteRecord: "a list scoped to the caller's sites; checked for leaks below" },
  "GET /api/biopsies/awaiting": { noSiteRecord: "a list scoped to the caller's sites; checked for leaks below" },
  "GET /api/admin/invitations": { noSiteRecord: "a list scoped to the admin's sites; checked for leaks below" },
  "GET /api/admin/followup-rules": { noSiteRecord: "a list scoped to the admin's sites; checked for leaks below" },
  "GET /api/me/preferences": { noSiteRecord: "the caller's own setting" },
  // The bench's transactional floor (app/api/bench/write-floor): a lesion-shaped body, no record.
  "POST /api/bench/write-floor": {
    noSiteRecord: "the benchmark's write floor: reads and changes no record",
    body: () => ({ clockStartH: 1, clockEndH: 2, distanceStartCm: 1, distanceEndCm: 2.5, grade: "lsil", vessels: [] }),
  },
  "PATCH /api/me/preferences": { noSiteRecord: "the caller's own setting", body: () => ({ displayConvention: "left_lateral" }) },
  "GET /api/exports/[dataset]": { query: (w) => `?studyId=${w.ids.studyId}` },
  "GET /api/exports/workbook": { query: (w) => `?studyId=${w.ids.studyId}` },
  "POST /api/exports/[dataset]": { body: (w) => ({ studyId: w.ids.studyId, identified: "1", reason: "Invented safety board request for follow-up letters" }) },
  "POST /api/exports/workbook": { body: (w) => ({ studyId: w.ids.studyId, identified: "1", reason: "Invented safety board request for follow-up letters" }) },
  "GET /api/attachments/[attachmentId]": { skipRightRole: "the fixture row has no stored object (404 'stored file is missing'); downloads are covered by attachments.test.ts" },
  "GET /api/visits/[visitId]/report": { params: (w) => ({ visitId: w.ids.signedVisitId }) },

  "POST /api/adjudications/[adjudicationId]/resolve": { body: () => ({ outcome: "recorded_kept" }) },
  "PUT /api/admin/followup-rules": { body: (w) => ({ siteId: w.siteA, rules: { clear_exam: 24 } }) },
  "POST /api/admin/invitations": { body: (w) => ({ email: `new-${randomUUID()}@test.example`, siteId: w.siteA, role: "reviewer" }) },
  "POST /api/admin/invitations/[invitationId]/resend": { body: "none" },
  "DELETE /api/admin/invitations/[invitationId]": { body: "none" },
  "PATCH /api/admin/users/[userId]": { body: () => ({ role: "reviewer" }) },
  "GET /api/admin/sites": { noSiteRecord: "a list of the admin's own sites; checked for leaks below" },
  "POST /api/admin/sites": { noSiteRecord: "a new site, not a record of site A", body: () => ({ name: "Invented Test Site", code: `T${randomUUID().slice(0, 5).replace(/-/g, "").toUpperCase()}`, timeZone: "America/Chicago", postalCode: "60614" }) },
  "PATCH /api/admin/sites/[siteId]": { params: (w) => ({ siteId: w.siteA }), body: () => ({ version: 1, postalCode: "60614" }), skipRightRole: "the version moves with each edit; edits are covered by sites.test.ts" },
  "PUT /api/admin/users/[userId]/sites": { body: (w) => ({ siteIds: [w.siteA] }) },
  "DELETE /api/attachments/[attachmentId]": { body: "none", skipRightRole: "the fixture row has no stored object; deletion is covered by attachments.test.ts" },
  "PATCH /api/biopsies/[biopsyId]": { body: () => ({ histology: "hsil" }) },
  "DELETE /api/biopsies/[biopsyId]": { body: "none" },
  "POST /api/patients/import/check": { body: (w) => ({ siteId: w.siteA, format: "csv", content: importCsv() }) },
  "POST /api/patients/import": { body: (w) => ({ siteId: w.siteA, format: "csv", content: importCsv(), acceptValidRows: true }) },
  "POST /api/patients": {
    noSiteRecord: "a new patient at the caller's own site; another site's id is refused (patients.test.ts)",
    body: (w) => ({ siteId: w.siteA, familyName: "Matrixperson", givenName: "Quinn", dateOfBirth: "1981-02-03", sexAtBirth: "female", mrn: `MX-${randomUUID().slice(0, 8)}`, hivStatus: "unknown", riskGroups: [], confirmDuplicate: true }),
  },
  "PATCH /api/patients/[patientId]": { body: () => ({ version: 1, postalCode: "60614" }), skipRightRole: "the version moves with each edit; edits are covered by patients.test.ts" },
  "POST /api/patients/[patientId]/reviews": { body: (w) => ({ visitId: w.ids.signedVisitId, reviewerId: w.a.reviewer.userId }) },
  "POST /api/patients/[patientId]/visits": { body: () => ({ visitDate: "2026-02-03", patientPosition: "lithotomy" }) },
  "PUT /api/reviews/[reviewId]/adjudications": { body: (w) => ({ trackId: w.ids.trackId, verdict: "agree" }) },
  "POST /api/reviews/[reviewId]/sign-off": { body: "none" },
  "PATCH /api/studies/[studyId]/enrolments/[enrolmentId]": { body: () => ({ withdrawnOn: "2025-01-02" }) },
  "POST /api/studies": { noSiteRecord: "a new study at the caller's own site", body: (w) => ({ code: `ST-${randomUUID().slice(0, 6).toUpperCase()}`, title: "Invented matrix study", siteIds: [w.siteA], startDate: "2025-01-06", consentFormVersion: "1" }) },
  "PATCH /api/studies/[studyId]": { body: () => ({ title: "Invented matrix study, renamed" }) },
  "POST /api/patients/[patientId]/consents": { body: (w) => ({ studyId: w.ids.studyId, consentedOn: "2025-01-02" }), skipRightRole: "the fixture patient may hold a current consent already; recording is covered by studies-consent.test.ts" },
  "PATCH /api/patients/[patientId]/consents/[consentId]": { params: (w) => ({ consentId: w.ids.consentId }), body: () => ({ withdrawnOn: "2025-06-02" }) },
  "POST /api/studies/[studyId]/enrolments": {
    body: (w) => ({ candidateRef: patientReference(w.ids.candidatePatientId), siteId: w.siteA, studySubjectId: `QN-${randomUUID().slice(0, 6)}`, consentDate: "2025-01-02" }),
  },
  "POST /api/visits/[visitId]/addenda": { params: (w) => ({ visitId: w.ids.signedVisitId }), body: () => ({ body: "Invented late note." }) },
  "DELETE /api/visits/[visitId]/anaesthetic/[doseId]": { body: "none" },
  "POST /api/visits/[visitId]/anaesthetic": { body: () => ({ agent: "lidocaine", concentrationPct: 1, volumeMl: 2, withEpinephrine: false }) },
  "POST /api/visits/[visitId]/attachments": { body: "multipart", skipRightRole: "an upload needs the S3 store; covered by attachments.test.ts and quality-uploads.test.ts" },
  "POST /api/visits/[visitId]/biopsies": { body: () => ({ clockH: 5, distanceCm: 1 }) },
  "DELETE /api/visits/[visitId]/complications/[id]": { body: "none" },
  "POST /api/visits/[visitId]/complications": { body: () => ({ kind: "bleeding", severity: "mild", timing: "after" }) },
  "POST /api/visits/[visitId]/diagnoses": { body: () => ({ code: "K62.82" }) },
  "DELETE /api/visits/[visitId]/diagnoses": { body: "none", query: () => "?code=K62.82" },
  "PATCH /api/visits/[visitId]/lesions/[lesionId]": { body: () => ({ version: 1, grade: "lsil" }) },
  "DELETE /api/visits/[visitId]/lesions/[lesionId]": { body: "none", query: () => "?version=1" },
  "POST /api/visits/[visitId]/lesions": { body: () => ({ clockStartH: 6, clockEndH: 7, distanceStartCm: 1, distanceEndCm: 2, grade: "lsil" }) },
  "PATCH /api/visits/[visitId]": { body: () => ({ version: 1, visitDate: "2026-03-02", patientPosition: "lithotomy", cytology: "not_done", hpvResult: "not_done" }) },
  "POST /api/visits/[visitId]/sign": { body: "none" },
  "POST /api/visits/[visitId]/tracks": { body: (w) => ({ action: "uncheck", trackId: w.ids.trackId }) },
  "DELETE /api/visits/[visitId]/treatments/[treatmentId]": { body: "none" },
  "POST /api/visits/[visitId]/discard": { body: () => ({ reason: "Started on the wrong patient by mistake" }) },
  "POST /api/visits/[visitId]/treatments": { body: () => ({ modality: "electrocautery", arcs: [{ startH: 7, endH: 8 }] }) },
};

/** The public routes expected to answer without a session: those the access table marks "public". */
export const PUBLIC_ROUTES = new Set(Object.keys(ACCESS).filter((key) => ACCESS[key] === "public"));
