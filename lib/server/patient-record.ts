import "server-only";
import { getPatient, listVisitsForPatient } from "@/db/queries/patients";
import { consentsOfPatient, studiesAtSite } from "@/db/queries/research/consents";
import { recordAudit } from "@/db/queries/audit-write";
import type { SiteScope } from "@/db/queries/scope";
import { getPatientDue } from "./due-dates";

/** The patient page: the patient, their visits and next due date; the read audited. Null when not in scope. */
export async function readPatientRecord(scope: SiteScope, patientId: string, ip?: string) {
  const patient = await getPatient(scope, patientId);
  if (!patient) return null;
  const [visits, due, consents, studies] = await Promise.all([
    listVisitsForPatient(scope, patient.id), getPatientDue(scope, patient.id), consentsOfPatient(scope, patient.id), studiesAtSite(patient.siteId),
  ]);
  await recordAudit({ userId: scope.userId, siteId: patient.siteId, patientId: patient.id, action: "patient.read", ip });
  return { patient, visits, due, consents, studies };
}
