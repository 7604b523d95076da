import { recordAudit } from "@/lib/server/audit";
import { listEnrolmentCandidates } from "@/db/queries/research/enrolment";
import { getStudy, listEnrolments } from "@/db/queries/research/studies";
import { scopeOf } from "@/lib/auth/guard";
import { AppError } from "@/lib/errors";
import { idParam, readJson, route } from "@/lib/http/route";
import { updateStudy } from "@/lib/server/studies";
import { studyUpdateSchema } from "@/lib/validation/studies";

/** GET /api/studies/:studyId: the study, its enrolments by study ID, and the opaque enrolment pick list. */
export const GET = route<{ studyId: string }>({ roles: ["research_nurse", "admin"] }, async ({ user, params, ip }) => {
  const studyId = idParam(params.studyId);
  const scope = scopeOf(user);
  const study = await getStudy(scope, studyId);
  if (!study) throw new AppError("not_found");
  const [enrolled, candidates] = await Promise.all([listEnrolments(scope, studyId), listEnrolmentCandidates(scope, studyId)]);
  await recordAudit({ userId: user.id, ip, action: "study.read", entityType: "study", entityId: studyId });
  return { study, enrolments: enrolled, candidates };
});

/** PATCH /api/studies/:studyId: title, code, start date, consent form version, sites (among the caller's). */
export const PATCH = route<{ studyId: string }>({ roles: ["research_nurse", "admin"] }, async ({ req, user, params, ip }) => {
  const studyId = idParam(params.studyId);
  const input = await readJson(req, studyUpdateSchema);
  return { study: await updateStudy(scopeOf(user), studyId, input, ip) };
});
