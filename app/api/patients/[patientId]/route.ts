import { getPatient, listVisitsForPatient } from "@/db/queries/patients";
import { recordAudit } from "@/lib/server/audit";
import { scopeOf } from "@/lib/auth/guard";
import { AppError } from "@/lib/errors";
import { idParam, route } from "@/lib/http/route";

export const GET = route<{ patientId: string }>({ roles: ["clinician", "reviewer", "admin"] }, async ({ user, params, ip }) => {
  const scope = scopeOf(user);
  const patient = await getPatient(scope, idParam(params.patientId));
  if (!patient) throw new AppError("not_found");
  const visits = await listVisitsForPatient(scope, patient.id);
  await recordAudit({ userId: user.id, siteId: patient.siteId, patientId: patient.id, action: "patient.read", ip });
  return { patient, visits };
});
