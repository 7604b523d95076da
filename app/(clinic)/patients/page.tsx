import Link from "next/link";
import { z } from "zod";
import { AppShell } from "@/components/shell/app-shell";
import { listPatients } from "@/db/queries/patients";
import { scopeOf } from "@/lib/auth/guard";
import { CLINICAL_ROLES, requirePageRole } from "@/lib/auth/page-guard";

export const metadata = { title: "Patients" };

const searchSchema = z.object({
  q: z.string().max(100).optional().catch(undefined),
  page: z.coerce.number().int().min(1).max(10_000).optional().catch(1),
});

export default async function PatientsPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await requirePageRole(CLINICAL_ROLES);
  const { q, page } = searchSchema.parse(await searchParams);
  const result = await listPatients(scopeOf(user), { q, page });
  const link = (p: number) => `/patients?${new URLSearchParams({ ...(q ? { q } : {}), page: String(p) })}`;
  return (
    <AppShell user={user}>
      <div className="flex flex-wrap items-end justify-between gap-4">
        <div className="flex flex-wrap items-baseline gap-4">
          <h1 className="text-2xl font-bold">Patients</h1>
          {user.role === "clinician" || user.role === "admin" ? <Link href="/patients/import" className="font-semibold text-lagoon-700 underline-offset-2 hover:underline">Import patients…</Link> : null}
        </div>
        <form role="search" className="flex gap-2" action="/patients">
          <label htmlFor="q" className="sr-only">Search by name or MRN</label>
          <input id="q" name="q" defaultValue={q} placeholder="Name or MRN" className="min-h-11 w-64 rounded-md border border-rule-strong bg-panel px-3" />
          <button className="min-h-11 rounded-md bg-lagoon-600 px-4 font-semibold text-white hover:bg-lagoon-700">Search</button>
        </form>
      </div>
      <p className="mt-2 text-sm text-ink-soft">{result.total} {result.total === 1 ? "patient" : "patients"}{q ? ` matching “${q}”` : ""}</p>
      <table className="mt-4 w-full border-collapse overflow-hidden rounded-lg bg-panel text-left">
        <thead className="border-b border-rule bg-lagoon-50 text-sm">
          <tr><th className="px-3 py-2">Name</th><th className="px-3 py-2">MRN</th><th className="px-3 py-2">Date of birth</th></tr>
        </thead>
        <tbody>
          {result.rows.map((p) => (
            <tr key={p.id} className="border-b border-rule last:border-0 hover:bg-paper">
              <td className="px-3 py-2"><Link className="font-semibold text-lagoon-700 underline-offset-2 hover:underline" href={`/patients/${p.id}`}>{p.familyName}, {p.givenName}</Link></td>
              <td className="px-3 py-2 tabular-nums">{p.mrn}</td>
              <td className="px-3 py-2 tabular-nums">{p.dateOfBirth}</td>
            </tr>
          ))}
          {result.rows.length === 0 ? <tr><td colSpan={3} className="px-3 py-6 text-center text-ink-soft">No patients found.</td></tr> : null}
        </tbody>
      </table>
      <nav aria-label="Pages" className="mt-4 flex items-center gap-3">
        {result.page > 1 ? <Link className="min-h-11 rounded-md border border-rule-strong px-3 py-2 font-semibold" href={link(result.page - 1)}>← Previous</Link> : null}
        <span className="text-sm text-ink-soft">Page {result.page} of {result.pageCount}</span>
        {result.page < result.pageCount ? <Link className="min-h-11 rounded-md border border-rule-strong px-3 py-2 font-semibold" href={link(result.page + 1)}>Next →</Link> : null}
      </nav>
    </AppShell>
  );
}
