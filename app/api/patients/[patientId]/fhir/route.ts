import { recordAudit } from "@/lib/server/audit";
import { getPatient } from "@/db/queries/patients";
import { loadPatientBundleInput } from "@/db/queries/research/fhir";
import { scopeOf } from "@/lib/auth/guard";
import { CLINICAL_ROLES } from "@/lib/auth/page-guard";
import { AppError } from "@/lib/errors";
import { buildPatientBundle } from "@/lib/fhir";
import { idParam, json, route } from "@/lib/http/route";

/** GET /api/patients/:patientId/fhir: the identified FHIR R4 bundle of one patient, for the clinic. */
export const GET = route<{ patientId: string }>({ roles: CLINICAL_ROLES }, async ({ user, params, ip }) => {
  const patientId = idParam(params.patientId);
  const patient = await getPatient(scopeOf(user), patientId);
  if (!patient) throw new AppError("not_found");
  const input = await loadPatientBundleInput(patient.id, patient.siteId);
  if (!input) throw new AppError("not_found");
  const bundle = buildPatientBundle(input, { timestamp: new Date().toISOString() });
  await recordAudit({ userId: user.id, ip, siteId: patient.siteId, patientId: patient.id, action: "fhir.export", entityType: "patient", entityId: patient.id, detail: { resources: bundle.entry.length } });
  return json(bundle, 200, { "content-type": "application/fhir+json; charset=utf-8" });
});
