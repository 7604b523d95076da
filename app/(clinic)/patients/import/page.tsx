import Link from "next/link";
import { AppShell } from "@/components/shell/app-shell";
import { ImportPanel } from "@/components/patient-import/import-panel";
import { sitesNamed } from "@/db/queries/patient-import";
import { requirePageRole } from "@/lib/auth/page-guard";

export const metadata = { title: "Import patients" };

export default async function ImportPatientsPage() {
  const user = await requirePageRole(["clinician", "admin"]);
  const sites = await sitesNamed(user.siteIds);
  return (
    <AppShell user={user}>
      <p className="text-sm"><Link href="/patients" className="text-lagoon-700 underline">Patients</Link> ›</p>
      <h1 className="text-2xl font-bold">Import patients</h1>
      <p className="mt-1 max-w-3xl text-ink-soft">
        Choose a CSV file with a header line (one patient per line), or a FHIR R4 Bundle of Patient resources. Every row is checked
        first; you see the first rows, which column fills which field, and every problem by line before anything is written.
      </p>
      {sites.length ? <ImportPanel sites={sites} /> : <p className="mt-4">You are not assigned to a site, so there is nowhere to import to. Ask an administrator.</p>}
    </AppShell>
  );
}
