import { recordAudit } from "@/lib/server/audit";
import { getEnrolment, withdrawEnrolment } from "@/db/queries/research/studies";
import { scopeOf } from "@/lib/auth/guard";
import { AppError } from "@/lib/errors";
import { idParam, readJson, route } from "@/lib/http/route";
import { withdrawSchema } from "@/lib/validation/research";

/** PATCH /api/studies/:studyId/enrolments/:enrolmentId: records a withdrawal date. */
export const PATCH = route<{ studyId: string; enrolmentId: string }>({ roles: ["research_nurse", "admin"] }, async ({ req, user, params, ip }) => {
  const studyId = idParam(params.studyId);
  const enrolmentId = idParam(params.enrolmentId);
  const enrolment = await getEnrolment(scopeOf(user), studyId, enrolmentId);
  if (!enrolment) throw new AppError("not_found");
  const { withdrawnOn } = await readJson(req, withdrawSchema);
  if (withdrawnOn < enrolment.consentDate) throw new AppError("invalid", undefined, { withdrawnOn: ["Withdrawal cannot come before consent."] });
  if (enrolment.withdrawnOn) throw new AppError("conflict", `Already withdrawn on ${enrolment.withdrawnOn}.`);
  await withdrawEnrolment(enrolmentId, withdrawnOn);
  await recordAudit({ userId: user.id, ip, siteId: enrolment.siteId, patientId: enrolment.patientId, action: "enrolment.withdraw", entityType: "enrolment", entityId: enrolmentId, detail: { studyId, withdrawnOn } });
  return { id: enrolmentId, withdrawnOn };
});
