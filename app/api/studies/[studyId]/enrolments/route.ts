import { recordAudit } from "@/lib/server/audit";
import { findCandidate, insertEnrolment, subjectIdTaken } from "@/db/queries/research/enrolment";
import { getStudy } from "@/db/queries/research/studies";
import { scopeOf } from "@/lib/auth/guard";
import { AppError } from "@/lib/errors";
import { idParam, json, readJson, route } from "@/lib/http/route";
import { enrolSchema } from "@/lib/validation/research";

/** POST /api/studies/:studyId/enrolments: enrols a consenting patient picked by opaque reference. */
export const POST = route<{ studyId: string }>({ roles: ["research_nurse", "admin"] }, async ({ req, user, params, ip }) => {
  const studyId = idParam(params.studyId);
  const scope = scopeOf(user);
  const study = await getStudy(scope, studyId);
  if (!study) throw new AppError("not_found");
  const input = await readJson(req, enrolSchema);
  if (!study.sites.some((s) => s.id === input.siteId)) throw new AppError("not_found");
  const today = new Date().toISOString().slice(0, 10);
  if (input.consentDate > today) throw new AppError("invalid", undefined, { consentDate: ["Consent cannot be dated in the future."] });
  const patientId = await findCandidate(scope, studyId, input.siteId, input.candidateRef);
  if (!patientId) throw new AppError("invalid", undefined, { candidateRef: ["This patient is not available for enrolment (no research consent, or already enrolled)."] });
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
  await recordAudit({ userId: user.id, ip, siteId: input.siteId, patientId, action: "enrolment.create", entityType: "enrolment", entityId: id, detail: { studyId, studySubjectId: input.studySubjectId } });
  return json({ id, studySubjectId: input.studySubjectId }, 201);
});
