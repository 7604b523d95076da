import { withdrawPatient } from "@/lib/server/enrolment";
import { scopeOf } from "@/lib/auth/guard";
import { idParam, readJson, route } from "@/lib/http/route";
import { withdrawSchema } from "@/lib/validation/research";

/** PATCH /api/studies/:studyId/enrolments/:enrolmentId: records a withdrawal date. */
export const PATCH = route<{ studyId: string; enrolmentId: string }>({ roles: ["research_nurse", "admin"] }, async ({ req, user, params, ip }) => {
  const studyId = idParam(params.studyId);
  const enrolmentId = idParam(params.enrolmentId);
  const input = await readJson(req, withdrawSchema);
  return withdrawPatient(scopeOf(user), studyId, enrolmentId, input, ip);
});
