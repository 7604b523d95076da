import Link from "next/link";
import { notFound } from "next/navigation";
import { AppShell } from "@/components/shell/app-shell";
import { readPatientRecord } from "@/lib/server/patient-record";
import { scopeOf } from "@/lib/auth/guard";
import { CLINICAL_ROLES, pageClientIp, requirePageRole } from "@/lib/auth/page-guard";
import { uuidParam } from "@/lib/http/route";
import { NewVisitForm } from "@/components/patient/new-visit-form";
import { FollowupBanner } from "@/components/due-dates/overdue-flag";
import { ConsentsPanel } from "@/components/patient/consents-panel";
import { overrideDueAction } from "./override-due-action";
import { ScreeningGuidance } from "@/components/due-dates/screening-guidance";
import { OpenDisagreements } from "@/components/review/open-disagreements";
import { POSITION_WORDS } from "@/lib/domain/labels";

export const metadata = { title: "Patient" };


export default async function PatientPage({ params }: { params: Promise<{ patientId: string }> }) {
  const user = await requirePageRole(CLINICAL_ROLES);
  const id = uuidParam.safeParse((await params).patientId);
  if (!id.success) notFound();
  const scope = scopeOf(user);
  const record = await readPatientRecord(scope, id.data, await pageClientIp());
  if (!record) notFound();
  const { patient, visits: visitList, due, consents, studies } = record;
  return (
    <AppShell user={user}>
      <p className="text-sm"><Link href="/patients" className="text-lagoon-700 underline">Patients</Link> /</p>
      <div className="mt-1 flex flex-wrap items-center gap-3">
        <h1 className="text-2xl font-bold">{patient.familyName}, {patient.givenName}</h1>
        {patient.status !== "active" ? <span className="rounded border border-rule-strong px-2 py-0.5 text-sm font-semibold text-ink-soft">{patient.status === "deceased" ? "Deceased" : "Inactive: not followed here"}</span> : null}
        <nav aria-label="Patient views" className="no-print ml-auto flex gap-2">
          {user.role === "clinician" || user.role === "admin" ? (
            <Link href={`/patients/${patient.id}/edit`} className="inline-flex min-h-11 items-center rounded-md border border-rule-strong bg-panel px-4 font-semibold hover:bg-lagoon-50">Correct details</Link>
          ) : null}
          <Link href={`/patients/${patient.id}/timeline`} className="inline-flex min-h-11 items-center rounded-md border border-rule-strong bg-panel px-4 font-semibold hover:bg-lagoon-50">Timeline</Link>
          <Link href={`/patients/${patient.id}/compare`} className="inline-flex min-h-11 items-center rounded-md border border-rule-strong bg-panel px-4 font-semibold hover:bg-lagoon-50">Compare visits</Link>
        </nav>
      </div>
      <dl className="mt-3 grid grid-cols-2 gap-x-8 gap-y-1 text-sm sm:grid-cols-4">
        <div><dt className="text-ink-soft">MRN</dt><dd className="font-semibold tabular-nums">{patient.mrn}</dd></div>
        <div><dt className="text-ink-soft">Date of birth</dt><dd className="font-semibold tabular-nums">{patient.dateOfBirth}</dd></div>
        <div><dt className="text-ink-soft">Sex at birth</dt><dd className="font-semibold">{patient.sexAtBirth}</dd></div>
        <div><dt className="text-ink-soft">HIV status</dt><dd className="font-semibold">{patient.hivStatus}</dd></div>
      </dl>
      <div className="mt-4 space-y-3">
        <FollowupBanner patientId={patient.id} due={due} overrideAction={user.role === "clinician" || user.role === "admin" ? overrideDueAction : undefined} />
        <OpenDisagreements patientId={patient.id} canResolve={user.role === "clinician" || user.role === "admin"} />
        <details className="rounded-md border border-rule bg-panel px-4 py-2" open={consents.some((c) => !c.withdrawnOn) || undefined}>
          <summary className="min-h-11 cursor-pointer py-2 font-semibold">Research consent</summary>
          <div className="pb-3">
            <ConsentsPanel patientId={patient.id} consents={consents} studies={studies} canRecord={user.role === "clinician" || user.role === "admin"} today={new Date().toISOString().slice(0, 10)} />
          </div>
        </details>
        <details className="rounded-md border border-rule bg-panel px-4 py-2">
          <summary className="min-h-11 cursor-pointer py-2 font-semibold">Screening guidance (IANS 2024)</summary>
          <ScreeningGuidance riskGroups={patient.riskGroups} dateOfBirth={patient.dateOfBirth} riskDate={patient.riskDate} />
        </details>
      </div>
      {user.role === "clinician" ? (
        <div className="mt-6"><NewVisitForm patientId={patient.id} today={new Date().toISOString().slice(0, 10)} /></div>
      ) : null}
      <h2 className="mt-8 text-lg font-bold">Visits</h2>
      <p className="text-sm text-ink-soft">Oldest on the left in every timeline; here the newest visit is listed first.</p>
      <table className="mt-2 w-full border-collapse rounded-lg bg-panel text-left">
        <thead className="border-b border-rule bg-lagoon-50 text-sm">
          <tr><th className="px-3 py-2">Date</th><th className="px-3 py-2">Examiner</th><th className="px-3 py-2">Position</th><th className="px-3 py-2">Record</th></tr>
        </thead>
        <tbody>
          {visitList.map((v) => (
            <tr key={v.id} className="border-b border-rule last:border-0">
              <td className="px-3 py-2 font-semibold tabular-nums"><Link className="text-lagoon-700 underline-offset-2 hover:underline" href={`/patients/${patient.id}/visits/${v.id}`}>{v.visitDate}</Link></td>
              <td className="px-3 py-2">{v.examinerName}</td>
              <td className="px-3 py-2">{POSITION_WORDS[v.patientPosition]}</td>
              <td className="px-3 py-2">{v.status === "signed" ? "Signed" : "Draft"}</td>
            </tr>
          ))}
          {visitList.length === 0 ? <tr><td colSpan={4} className="px-3 py-6 text-center text-ink-soft">No visits yet.</td></tr> : null}
        </tbody>
      </table>
    </AppShell>
  );
}
