import { recordAudit } from "@/lib/server/audit";
import { loadPatientBundleInput } from "@/db/queries/research/fhir";
import { findEnrolmentBySubject } from "@/db/queries/research/studies";
import { scopeOf } from "@/lib/auth/guard";
import { AppError } from "@/lib/errors";
import { buildPatientBundle } from "@/lib/fhir";
import { idParam, json, route } from "@/lib/http/route";
import { isoDate } from "@/lib/dates/calendar";
import { studySubjectIdSchema } from "@/lib/validation/research";

/**
 * GET /api/studies/:studyId/subjects/:subjectId/fhir: the de-identified FHIR bundle of one study
 * subject (dates cut to the year, study ID instead of name and MRN), up to any withdrawal.
 */
export const GET = route<{ studyId: string; subjectId: string }>({ roles: ["research_nurse", "admin"] }, async ({ user, params, ip }) => {
  const studyId = idParam(params.studyId);
  const subject = studySubjectIdSchema.safeParse(params.subjectId);
  if (!subject.success) throw new AppError("not_found");
  const enrolment = await findEnrolmentBySubject(scopeOf(user), studyId, subject.data);
  if (!enrolment) throw new AppError("not_found");
  const input = await loadPatientBundleInput(enrolment.patientId, enrolment.siteId, { beforeDate: enrolment.withdrawnOn });
  if (!input) throw new AppError("not_found");
  const bundle = buildPatientBundle(input, {
    deidentified: { studySubjectId: enrolment.studySubjectId, enrolmentDate: enrolment.consentDate, asOfDate: isoDate(new Date()) },
  });
  await recordAudit({ userId: user.id, ip, siteId: enrolment.siteId, patientId: enrolment.patientId, action: "fhir.export.deidentified", entityType: "enrolment", entityId: enrolment.id, detail: { studyId, resources: bundle.entry.length } });
  return json(bundle, 200, { "content-type": "application/fhir+json; charset=utf-8" });
});
