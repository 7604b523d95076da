import Link from "next/link";
import { AppShell } from "@/components/shell/app-shell";
import { ResultForm } from "@/components/biopsies/result-form";
import { listAwaitingResults } from "@/db/queries/biopsies";
import { scopeOf } from "@/lib/auth/guard";
import { pageClientIp, requirePageRole } from "@/lib/auth/page-guard";
import { recordAudit } from "@/lib/server/audit";
import { GRADE_LABEL } from "@/lib/domain/vocab";
import { describeSite } from "@/lib/geometry/conventions";

export const metadata = { title: "Biopsies awaiting results" };

export default async function BiopsiesPage() {
  const user = await requirePageRole(["clinician", "admin"]);
  const rows = await listAwaitingResults(scopeOf(user));
  // Names, MRNs and specimens of several patients: one audit row per page view, as the API records.
  await recordAudit({ userId: user.id, ip: await pageClientIp(), action: "biopsy.worklist.read", detail: { count: rows.length, patientIds: [...new Set(rows.map((r) => r.patientId))] } });
  return (
    <AppShell user={user}>
      <h1 className="text-2xl font-bold">Biopsies awaiting results</h1>
      <p className="mt-1 text-sm text-ink-soft">Oldest first. When the result differs from the impression, histology decides the grade for tracking.</p>
      <ul className="mt-4 space-y-3">
        {rows.map((b) => (
          <li key={b.id} className="rounded-lg border border-rule bg-panel p-4">
            <p className="font-semibold">
              Specimen {b.specimenLabel} · <Link className="text-lagoon-700 underline" href={`/patients/${b.patientId}/visits/${b.visitId}`}>{b.familyName}, {b.givenName}</Link> · {b.mrn} · visit {b.visitDate}
            </p>
            <p className="text-sm text-ink-soft">
              {b.lesionLabel ? `${b.lesionLabel}, impression ${GRADE_LABEL[b.impression!]} · ` : ""}
              {describeSite(b.clockH, b.clockH, b.distanceCm, b.distanceCm)} · examiner {b.examiner}
            </p>
            <div className="mt-2"><ResultForm biopsyId={b.id} specimen={b.specimenLabel} /></div>
          </li>
        ))}
        {rows.length === 0 ? <li className="rounded-lg bg-panel p-6 text-center text-ink-soft">No specimens are waiting for a result.</li> : null}
      </ul>
    </AppShell>
  );
}
