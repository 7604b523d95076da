import Link from "next/link";
import { AppShell } from "@/components/shell/app-shell";
import { PatientForm } from "@/components/patient/patient-form";
import { cliniciansBySite } from "@/db/queries/patients";
import { listSitesByIds } from "@/db/queries/sites";
import { requirePageRole } from "@/lib/auth/page-guard";

export const metadata = { title: "Register a patient" };

export default async function NewPatientPage() {
  const user = await requirePageRole(["clinician", "admin"]);
  const [sites, clinicians] = await Promise.all([listSitesByIds(user.siteIds), cliniciansBySite(user.siteIds)]);
  return (
    <AppShell user={user}>
      <p className="text-sm"><Link href="/patients" className="text-lagoon-700 underline">Patients</Link> /</p>
      <h1 className="mt-1 text-2xl font-bold">Register a patient</h1>
      <p className="mt-1 max-w-3xl text-sm text-ink-soft">
        Dentate checks the record number and looks for someone already registered with the same date of birth and a similar family name before it saves.
      </p>
      <div className="mt-4 max-w-3xl rounded-lg border border-rule bg-panel p-5">
        <PatientForm sites={sites.map((s) => ({ id: s.id, name: s.name }))} clinicians={clinicians} me={user.id} />
      </div>
    </AppShell>
  );
}
