import "server-only";
import { findCandidate, insertEnrolment, subjectIdIsSiteMrn, subjectIdTaken } from "@/db/queries/research/enrolment";
import { getEnrolment, getStudy, withdrawEnrolment } from "@/db/queries/research/studies";
import { recordAudit } from "@/db/queries/audit-write";
import { forgetStudyFigures } from "@/db/queries/research/stored-figures";
import type { SiteScope } from "@/db/queries/scope";
import { AppError } from "@/lib/errors";
import { isoDate } from "@/lib/dates/calendar";
import type { EnrolInput, WithdrawInput } from "@/lib/validation/research";

/** Enrols a consenting patient picked by opaque reference; the unique constraints settle a race. */
export async function enrolPatient(scope: SiteScope, studyId: string, input: EnrolInput, ip: string) {
  const study = await getStudy(scope, studyId);
  if (!study || !study.sites.some((s) => s.id === input.siteId)) throw new AppError("not_found");
  if (input.consentDate > isoDate(new Date())) throw new AppError("invalid", undefined, { consentDate: ["Consent cannot be dated in the future."] });
  const patientId = await findCandidate(scope, studyId, input.siteId, input.candidateRef);
  if (!patientId) throw new AppError("invalid", undefined, { candidateRef: ["This patient is not available for enrolment (no research consent, or already enrolled)."] });
  // A study ID travels into de-identified exports: an MRN typed there would re-identify the subject.
  if (await subjectIdIsSiteMrn(input.siteId, input.studySubjectId)) {
    throw new AppError("invalid", undefined, { studySubjectId: ["This is a medical record number at this site. Use the study's own subject ID."] });
  }
  if (await subjectIdTaken(studyId, input.studySubjectId)) {
    throw new AppError("conflict", "This study ID is already in use.", { studySubjectId: ["This study ID is already in use in this study."] });
  }
  let id: string;
  try {
    id = await insertEnrolment({ studyId, patientId, siteId: input.siteId, studySubjectId: input.studySubjectId, consentDate: input.consentDate });
  } catch (err) {
    // Two nurses enrolling the same person or ID at once: the unique constraints decide.
    if ((err as { code?: string }).code === "23505") throw new AppError("conflict", "This patient or study ID was enrolled a moment ago.");
    throw err;
  }
  // Who takes part changes every study figure: the dashboard works them out again on its next load.
  await forgetStudyFigures(studyId, input.siteId);
  await recordAudit({ userId: scope.userId, ip, siteId: input.siteId, patientId, action: "enrolment.create", entityType: "enrolment", entityId: id, detail: { studyId, studySubjectId: input.studySubjectId } });
  return { id, studySubjectId: input.studySubjectId };
}

/** Records a withdrawal date (once, not before consent). */
export async function withdrawPatient(scope: SiteScope, studyId: string, enrolmentId: string, input: WithdrawInput, ip: string) {
  const enrolment = await getEnrolment(scope, studyId, enrolmentId);
  if (!enrolment) throw new AppError("not_found");
  if (input.withdrawnOn < enrolment.consentDate) throw new AppError("invalid", undefined, { withdrawnOn: ["Withdrawal cannot come before consent."] });
  if (enrolment.withdrawnOn) throw new AppError("conflict", `Already withdrawn on ${enrolment.withdrawnOn}.`);
  await withdrawEnrolment(enrolmentId, input.withdrawnOn);
  await forgetStudyFigures(studyId, enrolment.siteId);
  await recordAudit({ userId: scope.userId, ip, siteId: enrolment.siteId, patientId: enrolment.patientId, action: "enrolment.withdraw", entityType: "enrolment", entityId: enrolmentId, detail: { studyId, withdrawnOn: input.withdrawnOn } });
  return { id: enrolmentId, withdrawnOn: input.withdrawnOn };
}
