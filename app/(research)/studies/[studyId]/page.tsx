import Link from "next/link";
import { notFound } from "next/navigation";
import { AppShell } from "@/components/shell/app-shell";
import { EnrolForm } from "@/components/research/enrol-form";
import { ExportPanel } from "@/components/research/export-panel";
import { QuarterGradeChart } from "@/components/research/quarter-grade-chart";
import { RecurrenceChart } from "@/components/research/recurrence-chart";
import { WithdrawControl } from "@/components/research/withdraw-control";
import { recordAudit } from "@/lib/server/audit";
import { loadRegistryDashboard } from "@/lib/server/research";
import { listEnrolmentCandidates } from "@/db/queries/research/enrolment";
import { getStudy, listEnrolments } from "@/db/queries/research/studies";
import { listSitesByIds } from "@/db/queries/sites";
import { StudyForm } from "@/components/research/study-form";
import { scopeOf } from "@/lib/auth/guard";
import { requirePageRole, pageClientIp } from "@/lib/auth/page-guard";
import { uuidParam } from "@/lib/http/route";
import { MIN_AT_RISK_FOR_RATE } from "@/lib/stats/study-figures";

export const metadata = { title: "Study" };
export const dynamic = "force-dynamic";

const pct = (num: number, den: number) => (den === 0 ? "–" : `${Math.round((100 * num) / den)}%`);

function nextSubjectId(code: string, taken: string[]): string {
  const prefix = code.split("-").slice(-2, -1)[0] ?? "S";
  const nums = taken.map((t) => Number(/(\d+)$/.exec(t)?.[1] ?? 0));
  return `${prefix}-${String(Math.max(0, ...nums) + 1).padStart(3, "0")}`;
}

export default async function StudyPage({ params }: { params: Promise<{ studyId: string }> }) {
  const user = await requirePageRole(["research_nurse", "admin"]);
  const id = uuidParam.safeParse((await params).studyId);
  if (!id.success) notFound();
  const scope = scopeOf(user);
  const study = await getStudy(scope, id.data);
  if (!study) notFound();
  const siteIds = study.sites.map((s) => s.id);
  const [enrolled, candidates, dash, mySites] = await Promise.all([
    listEnrolments(scope, study.id),
    listEnrolmentCandidates(scope, study.id),
    loadRegistryDashboard(study.id, siteIds),
    listSitesByIds(user.siteIds),
  ]);
  await recordAudit({ userId: user.id, ip: await pageClientIp(), action: "study.read", entityType: "study", entityId: study.id });
  const today = new Date().toISOString().slice(0, 10);
  const r = dash.recurrence;
  const stat = (label: string, value: string | number, note?: string) => (
    <div className="rounded-lg border border-rule bg-panel p-3">
      <div className="text-sm text-ink-soft">{label}</div>
      <div className="text-2xl font-bold tabular-nums">{value}</div>
      {note ? <div className="text-xs text-ink-soft">{note}</div> : null}
    </div>
  );

  return (
    <AppShell user={user}>
      <p className="text-sm"><Link href="/studies" className="text-lagoon-700 underline">Studies</Link> /</p>
      <h1 className="mt-1 text-2xl font-bold">{study.code} · {study.title}</h1>
      <p className="text-sm text-ink-soft">Started {study.startDate} · Consent form version {study.consentFormVersion} · Sites: {study.sites.map((s) => s.code).join(", ")}</p>
      <details className="mt-3 rounded-md border border-rule bg-panel px-4 py-2">
        <summary className="min-h-11 cursor-pointer py-2 font-semibold">Edit the study</summary>
        <StudyForm study={{ ...study, siteIds: study.sites.map((s) => s.id) }} sites={mySites} />
      </details>

      <section aria-labelledby="registry" className="mt-6">
        <h2 id="registry" className="text-lg font-bold">Registry</h2>
        <p className="text-sm text-ink-soft">Signed visits of enrolled patients, up to any withdrawal; the same figures as the exports.</p>
        <p className="text-sm text-ink-soft" data-figures-as-of={dash.asOf}>
          Figures as of {dash.asOf.slice(0, 10)} {dash.asOf.slice(11, 16)} UTC; they are worked out again when a page load finds them over {dash.maxAgeMinutes} minutes old.
          {dash.refreshing ? " Newer figures are being worked out now: reload in a minute." : ""}
        </p>
        <div className="mt-3 grid grid-cols-2 gap-3 sm:grid-cols-4">
          {stat("Patients taking part", dash.patients)}
          {stat("Visits", dash.visits)}
          {stat("Lesions", dash.lesions)}
          {stat(
            "Free of HSIL at 1 year",
            r.oneYear.rate === null ? "Too few followed" : `${Math.round(100 * r.oneYear.rate)}%`,
            `${r.oneYear.atRisk} still followed at 1 year${r.oneYear.rate === null ? ` (a rate needs at least ${MIN_AT_RISK_FOR_RATE})` : ""} · ${r.patients} cleared, ${r.events} recurred`,
          )}
        </div>
        <div className="mt-6 grid gap-6 lg:grid-cols-2">
          <div className="rounded-lg border border-rule bg-panel p-4">
            <h3 className="font-bold">Lesions by grade over time</h3>
            <QuarterGradeChart rows={dash.gradeByQuarter} emptyQuarters={dash.emptyQuarters} />
          </div>
          <div className="rounded-lg border border-rule bg-panel p-4">
            <h3 className="font-bold">Staying free of HSIL after clearance</h3>
            <p className="text-xs text-ink-soft">Kaplan–Meier; HSIL anywhere after a clear visit counts, censored at the last visit.{r.medianDays !== null ? ` Median ${r.medianDays} days.` : " Median not reached."}</p>
            <RecurrenceChart points={r.steps.map((s) => ({ time: s.time, survival: s.survival }))} ticks={r.ticks} atRisk={r.atRisk} />
          </div>
        </div>
        <div className="mt-4 grid grid-cols-1 gap-3 sm:grid-cols-2">
          {stat("Clearance per treated lesion", pct(dash.clearance.lesionsCleared, dash.clearance.lesionsTreatedFollowed), `${dash.clearance.lesionsCleared} of ${dash.clearance.lesionsTreatedFollowed} treated lesions followed up were cleared or regressed at the next visit`)}
          {stat("Clearance per treated patient", pct(dash.clearance.patientsCleared, dash.clearance.patientsTreatedFollowed), `${dash.clearance.patientsCleared} of ${dash.clearance.patientsTreatedFollowed} treated patients followed up had a visit without HSIL`)}
        </div>
      </section>

      <section aria-labelledby="exports" className="mt-8 rounded-lg border border-rule bg-panel p-4">
        <h2 id="exports" className="text-lg font-bold">Exports</h2>
        <ExportPanel studyId={study.id} sites={study.sites.map((s) => ({ id: s.id, code: s.code }))} canIdentify={user.role === "admin"} />
      </section>

      <section aria-labelledby="enrolment" className="mt-8">
        <h2 id="enrolment" className="text-lg font-bold">Enrolment</h2>
        <div className="mt-2 rounded-lg border border-rule bg-panel p-4">
          <EnrolForm studyId={study.id} candidates={candidates} suggestedId={nextSubjectId(study.code, enrolled.map((e) => e.studySubjectId))} today={today} />
        </div>
        <table className="mt-3 w-full border-collapse rounded-lg bg-panel text-left">
          <thead className="border-b border-rule bg-lagoon-50 text-sm">
            <tr><th className="px-3 py-2">Study ID</th><th className="px-3 py-2">Site</th><th className="px-3 py-2">Consent</th><th className="px-3 py-2 text-right">Signed visits</th><th className="px-3 py-2">Status</th></tr>
          </thead>
          <tbody>
            {enrolled.map((e) => (
              <tr key={e.id} className="border-b border-rule last:border-0">
                <td className="px-3 py-2 font-semibold">{e.studySubjectId}</td>
                <td className="px-3 py-2">{e.siteCode}</td>
                <td className="px-3 py-2 tabular-nums">{e.consentDate}</td>
                <td className="px-3 py-2 text-right tabular-nums">{e.signedVisits}</td>
                <td className="px-3 py-2">
                  {e.withdrawnOn ? <span>Withdrawn {e.withdrawnOn}</span> : <WithdrawControl studyId={study.id} enrolmentId={e.id} studySubjectId={e.studySubjectId} consentDate={e.consentDate} today={today} />}
                </td>
              </tr>
            ))}
            {enrolled.length === 0 ? <tr><td colSpan={5} className="px-3 py-6 text-center text-ink-soft">Nobody enrolled yet.</td></tr> : null}
          </tbody>
        </table>
      </section>
    </AppShell>
  );
}
