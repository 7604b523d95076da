import "server-only";
// Studies and research consent. Administrators and research nurses set studies up at their own
// sites; clinicians and administrators record a patient's consent and its withdrawal. Enrolment
// requires a current consent to that study. Every change is audited.
import { db } from "@/db/client";
import {
  consentOfPatientForUpdate, currentConsent, insertConsent, insertStudy, markConsentWithdrawn, setStudySites, studyAtSite, studyCodeTaken, studyForUpdate, updateStudyRow,
} from "@/db/queries/research/consents";
import { patientSiteInScope } from "@/db/queries/visits";
import { recordAudit } from "@/db/queries/audit-write";
import type { SiteScope } from "@/db/queries/scope";
import { AppError } from "@/lib/errors";
import { isoDate } from "@/lib/dates/calendar";
import type { ConsentInput, StudyInput, StudyUpdateInput } from "@/lib/validation/studies";

const CODE_TAKEN = { code: ["Another study already uses this code."] };
const NOT_YOURS = { siteIds: ["Choose sites you work at."] };

export async function createStudy(scope: SiteScope, input: StudyInput, ip: string) {
  if (input.siteIds.some((s) => !scope.siteIds.includes(s))) throw new AppError("invalid", undefined, NOT_YOURS);
  return db.transaction(async (tx) => {
    if (await studyCodeTaken(tx, input.code)) throw new AppError("conflict", "Another study already uses this code.", CODE_TAKEN);
    const { siteIds, ...values } = input;
    const study = await insertStudy(tx, values, [...new Set(siteIds)]);
    await recordAudit({ userId: scope.userId, action: "study.create", entityType: "study", entityId: study.id, ip, detail: { after: { ...values, siteIds } } }, tx);
    return study;
  });
}

/** Edits a study the caller can see; its sites change only among the caller's own (others are kept). */
export async function updateStudy(scope: SiteScope, studyId: string, input: StudyUpdateInput, ip: string) {
  return db.transaction(async (tx) => {
    const before = await studyForUpdate(tx, studyId);
    if (!before || !before.siteIds.some((s) => scope.siteIds.includes(s))) throw new AppError("not_found");
    const { siteIds, ...set } = input;
    if (set.code && set.code !== before.code && (await studyCodeTaken(tx, set.code, studyId))) throw new AppError("conflict", "Another study already uses this code.", CODE_TAKEN);
    let afterSites = before.siteIds;
    if (siteIds) {
      if (siteIds.some((s) => !scope.siteIds.includes(s))) throw new AppError("invalid", undefined, NOT_YOURS);
      const mine = before.siteIds.filter((s) => scope.siteIds.includes(s));
      await setStudySites(tx, studyId, siteIds.filter((s) => !before.siteIds.includes(s)), mine.filter((s) => !siteIds.includes(s)));
      afterSites = [...new Set([...before.siteIds.filter((s) => !scope.siteIds.includes(s)), ...siteIds])].sort();
      if (afterSites.length === 0) throw new AppError("invalid", undefined, { siteIds: ["Choose at least one site."] });
    }
    await updateStudyRow(tx, studyId, set);
    const beforeValues = { id: before.id, code: before.code, title: before.title, startDate: before.startDate, consentFormVersion: before.consentFormVersion };
    await recordAudit({
      userId: scope.userId, action: "study.update", entityType: "study", entityId: studyId, ip,
      detail: { before: { ...beforeValues, siteIds: before.siteIds }, after: { ...beforeValues, ...set, siteIds: afterSites } },
    }, tx);
    return { ...beforeValues, ...set, siteIds: afterSites };
  });
}

/** Records a patient's consent to a study running at the patient's site (one current consent per study). */
export async function recordConsent(scope: SiteScope, patientId: string, input: ConsentInput, ip: string) {
  if (input.consentedOn > isoDate(new Date())) throw new AppError("invalid", undefined, { consentedOn: ["Consent cannot be dated in the future."] });
  return db.transaction(async (tx) => {
    const patient = await patientSiteInScope(tx, scope, patientId);
    if (!patient) throw new AppError("not_found");
    const study = await studyAtSite(tx, input.studyId, patient.siteId);
    if (!study) throw new AppError("invalid", undefined, { studyId: ["This study does not run at the patient's site."] });
    if (await currentConsent(tx, patient.id, study.id)) throw new AppError("conflict", "This patient's consent to this study is already recorded.", { studyId: ["Consent already recorded; withdraw it first to record a new one."] });
    const formVersion = input.formVersion ?? study.consentFormVersion;
    const id = await insertConsent(tx, { patientId: patient.id, studyId: study.id, siteId: patient.siteId, consentedOn: input.consentedOn, formVersion, recordedBy: scope.userId });
    await recordAudit({ userId: scope.userId, siteId: patient.siteId, patientId: patient.id, action: "consent.record", entityType: "research_consent", entityId: id, ip, detail: { studyId: study.id, consentedOn: input.consentedOn, formVersion } }, tx);
    return { id, studyId: study.id, consentedOn: input.consentedOn, formVersion };
  });
}

/** Records a withdrawal of consent (not before it was given, not in the future, once). */
export async function withdrawConsent(scope: SiteScope, patientId: string, consentId: string, withdrawnOn: string, ip: string) {
  if (withdrawnOn > isoDate(new Date())) throw new AppError("invalid", undefined, { withdrawnOn: ["A withdrawal cannot be dated in the future."] });
  return db.transaction(async (tx) => {
    const consent = await consentOfPatientForUpdate(tx, scope, patientId, consentId);
    if (!consent) throw new AppError("not_found");
    if (consent.withdrawnOn) throw new AppError("conflict", `Already withdrawn on ${consent.withdrawnOn}.`);
    if (withdrawnOn < consent.consentedOn) throw new AppError("invalid", undefined, { withdrawnOn: ["Withdrawal cannot come before consent."] });
    await markConsentWithdrawn(tx, consent.id, withdrawnOn, scope.userId);
    await recordAudit({ userId: scope.userId, siteId: consent.siteId, patientId, action: "consent.withdraw", entityType: "research_consent", entityId: consent.id, ip, detail: { studyId: consent.studyId, withdrawnOn } }, tx);
    return { id: consent.id, withdrawnOn };
  });
}
