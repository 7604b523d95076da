import { recordAudit } from "@/lib/server/audit";
import { listEnrolmentCandidates } from "@/db/queries/research/enrolment";
import { getStudy, listEnrolments } from "@/db/queries/research/studies";
import { scopeOf } from "@/lib/auth/guard";
import { AppError } from "@/lib/errors";
import { idParam, route } from "@/lib/http/route";

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
