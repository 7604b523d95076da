import Link from "next/link";
import { notFound } from "next/navigation";
import { AppShell } from "@/components/shell/app-shell";
import { PatientForm } from "@/components/patient/patient-form";
import { cliniciansBySite, getPatient } from "@/db/queries/patients";
import { listSitesByIds } from "@/db/queries/sites";
import { scopeOf } from "@/lib/auth/guard";
import { requirePageRole, pageClientIp } from "@/lib/auth/page-guard";
import { uuidParam } from "@/lib/http/route";
import { recordAudit } from "@/lib/server/audit";

export const metadata = { title: "Correct patient details" };

export default async function EditPatientPage({ params }: { params: Promise<{ patientId: string }> }) {
  const user = await requirePageRole(["clinician", "admin"]);
  const id = uuidParam.safeParse((await params).patientId);
  if (!id.success) notFound();
  const patient = await getPatient(scopeOf(user), id.data);
  if (!patient) notFound();
  await recordAudit({ userId: user.id, ip: await pageClientIp(), siteId: patient.siteId, patientId: patient.id, action: "patient.read" });
  const [sites, clinicians] = await Promise.all([listSitesByIds([patient.siteId]), cliniciansBySite([patient.siteId])]);
  return (
    <AppShell user={user}>
      <p className="text-sm">
        <Link href="/patients" className="text-lagoon-700 underline">Patients</Link> /{" "}
        <Link href={`/patients/${patient.id}`} className="text-lagoon-700 underline">{patient.familyName}, {patient.givenName}</Link> /
      </p>
      <h1 className="mt-1 text-2xl font-bold">Correct patient details</h1>
      <p className="mt-1 max-w-3xl text-sm text-ink-soft">Every change is kept in the audit trail with the old and the new value. An inactive or deceased patient leaves the worklist and the reminders; the record stays.</p>
      <div className="mt-4 max-w-3xl rounded-lg border border-rule bg-panel p-5">
        <PatientForm sites={sites.map((s) => ({ id: s.id, name: s.name }))} clinicians={clinicians} patient={{
          id: patient.id, siteId: patient.siteId, familyName: patient.familyName, givenName: patient.givenName, dateOfBirth: patient.dateOfBirth,
          sexAtBirth: patient.sexAtBirth, mrn: patient.mrn, postalCode: patient.postalCode, hivStatus: patient.hivStatus, riskGroups: patient.riskGroups,
          riskDate: patient.riskDate, contactEmail: patient.contactEmail, clinicianId: patient.clinicianId, status: patient.status, version: patient.version,
        }} />
      </div>
    </AppShell>
  );
}
