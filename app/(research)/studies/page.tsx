import Link from "next/link";
import { AppShell } from "@/components/shell/app-shell";
import { listStudies } from "@/db/queries/research/studies";
import { listSitesByIds } from "@/db/queries/sites";
import { StudyForm } from "@/components/research/study-form";
import { scopeOf } from "@/lib/auth/guard";
import { requirePageRole } from "@/lib/auth/page-guard";

export const metadata = { title: "Studies" };

export default async function StudiesPage() {
  const user = await requirePageRole(["research_nurse", "admin"]);
  const [rows, sites] = await Promise.all([listStudies(scopeOf(user)), listSitesByIds(user.siteIds)]);
  return (
    <AppShell user={user}>
      <h1 className="text-2xl font-bold">Studies</h1>
      <p className="mt-1 text-sm text-ink-soft">Patients appear here by study ID only; names and MRNs stay with the clinic.</p>
      <table className="mt-4 w-full border-collapse rounded-lg bg-panel text-left">
        <thead className="border-b border-rule bg-lagoon-50 text-sm">
          <tr><th className="px-3 py-2">Code</th><th className="px-3 py-2">Title</th><th className="px-3 py-2">Started</th><th className="px-3 py-2 text-right">Enrolled</th><th className="px-3 py-2 text-right">Withdrawn</th></tr>
        </thead>
        <tbody>
          {rows.map((s) => (
            <tr key={s.id} className="border-b border-rule last:border-0">
              <td className="px-3 py-2 font-semibold"><Link href={`/studies/${s.id}`} className="text-lagoon-700 underline">{s.code}</Link></td>
              <td className="px-3 py-2">{s.title}</td>
              <td className="px-3 py-2 tabular-nums">{s.startDate}</td>
              <td className="px-3 py-2 text-right tabular-nums">{s.enrolled}</td>
              <td className="px-3 py-2 text-right tabular-nums">{s.withdrawn}</td>
            </tr>
          ))}
          {rows.length === 0 ? <tr><td colSpan={5} className="px-3 py-6 text-center text-ink-soft">No studies at your sites.</td></tr> : null}
        </tbody>
      </table>
      <h2 className="mt-10 text-xl font-bold">Set up a study</h2>
      <p className="mt-1 text-sm text-ink-soft">Clinicians then record each patient&apos;s consent on the patient page; only patients with a current consent can be enrolled.</p>
      <div className="mt-3 rounded-lg border border-rule bg-panel p-4"><StudyForm sites={sites} /></div>
    </AppShell>
  );
}
