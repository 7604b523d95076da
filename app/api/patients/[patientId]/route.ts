import { getPatient, listVisitsForPatient } from "@/db/queries/patients";
import { recordAudit } from "@/lib/server/audit";
import { updatePatient } from "@/lib/server/patients";
import { scopeOf } from "@/lib/auth/guard";
import { AppError } from "@/lib/errors";
import { idParam, readJson, route } from "@/lib/http/route";
import { updatePatientSchema } from "@/lib/validation/patients";

export const GET = route<{ patientId: string }>({ roles: ["clinician", "reviewer", "admin"] }, async ({ user, params, ip }) => {
  const scope = scopeOf(user);
  const patient = await getPatient(scope, idParam(params.patientId));
  if (!patient) throw new AppError("not_found");
  const visits = await listVisitsForPatient(scope, patient.id);
  await recordAudit({ userId: user.id, siteId: patient.siteId, patientId: patient.id, action: "patient.read", ip });
  return { patient, visits };
});

/** Corrects demographics or the follow-up status; `version` must be the one the form was read at (409 when stale). */
export const PATCH = route<{ patientId: string }>({ roles: ["clinician", "admin"] }, async ({ req, user, params, ip }) => {
  const patientId = idParam(params.patientId);
  const input = await readJson(req, updatePatientSchema);
  const patient = await updatePatient(user, scopeOf(user), patientId, input, ip);
  return { patient };
});
