import Link from "next/link";
import { z } from "zod";
import { AppShell } from "@/components/shell/app-shell";
import { scopeOf } from "@/lib/auth/guard";
import { CLINICAL_ROLES, requirePageRole } from "@/lib/auth/page-guard";
import { GRADE_LABEL } from "@/lib/domain/vocab";
import { listPatientOverview } from "@/lib/server/patient-list";
import { PATIENT_SORTS, type PatientSort } from "@/lib/validation/patients";

export const metadata = { title: "Patients" };

const searchSchema = z.object({
  q: z.string().max(100).optional().catch(undefined),
  page: z.coerce.number().int().min(1).max(10_000).catch(1).default(1),
  sort: z.enum(PATIENT_SORTS).catch("name").default("name"),
  dir: z.enum(["asc", "desc"]).catch("asc").default("asc"),
});

const COLUMNS: { key: PatientSort; label: string; numeric?: boolean }[] = [
  { key: "name", label: "Name" },
  { key: "mrn", label: "MRN" },
  { key: "lastVisit", label: "Last visit", numeric: true },
  { key: "nextDue", label: "Next due", numeric: true },
  { key: "grade", label: "Worst current grade" },
  { key: "disagreements", label: "Open disagreements", numeric: true },
];
const STATUS_WORDS = { inactive: "Inactive", deceased: "Deceased" } as const;

export default async function PatientsPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await requirePageRole(CLINICAL_ROLES);
  const { q, page, sort, dir } = searchSchema.parse(await searchParams);
  const result = await listPatientOverview(scopeOf(user), { q, page, sort, dir });
  const link = (o: { page?: number; sort?: PatientSort; dir?: string }) =>
    `/patients?${new URLSearchParams({ ...(q ? { q } : {}), sort: o.sort ?? sort, dir: o.dir ?? dir, page: String(o.page ?? 1) })}`;
  const canRegister = user.role === "clinician" || user.role === "admin";
  return (
    <AppShell user={user}>
      <div className="flex flex-wrap items-end justify-between gap-4">
        <div className="flex flex-wrap items-baseline gap-4">
          <h1 className="text-2xl font-bold">Patients</h1>
          {canRegister ? <Link href="/patients/import" className="inline-flex min-h-11 items-center font-semibold text-lagoon-700 underline-offset-2 hover:underline">Import patients…</Link> : null}
        </div>
        <div className="flex flex-wrap gap-2">
          <form role="search" className="flex gap-2" action="/patients">
            <label htmlFor="q" className="sr-only">Search by name or MRN</label>
            <input id="q" name="q" defaultValue={q} placeholder="Name or MRN" className="min-h-11 w-64 rounded-md border border-rule-strong bg-panel px-3" />
            <input type="hidden" name="sort" value={sort} />
            <input type="hidden" name="dir" value={dir} />
            <button className="min-h-11 rounded-md border border-rule-strong bg-panel px-4 font-semibold hover:bg-lagoon-50">Search</button>
          </form>
          {canRegister ? <Link href="/patients/new" className="inline-flex min-h-11 items-center rounded-md bg-lagoon-600 px-4 font-semibold text-white hover:bg-lagoon-700">Register a patient</Link> : null}
        </div>
      </div>
      <p className="mt-2 text-sm text-ink-soft">{result.total} {result.total === 1 ? "patient" : "patients"}{q ? ` matching “${q}”` : ""}. Due dates are suggestions from the clinic&apos;s rules; the clinician decides.</p>
      <table className="mt-4 w-full border-collapse overflow-hidden rounded-lg bg-panel text-left">
        <thead className="border-b border-rule bg-lagoon-50 text-sm">
          <tr>
            {COLUMNS.map((c) => {
              const active = c.key === sort;
              const next = active && dir === "asc" ? "desc" : "asc";
              return (
                <th key={c.key} scope="col" aria-sort={active ? (dir === "asc" ? "ascending" : "descending") : undefined} className="px-1 py-0">
                  <Link href={link({ sort: c.key, dir: next })} className={`flex min-h-11 items-center gap-1 rounded px-2 hover:bg-lagoon-100 ${active ? "text-lagoon-900" : ""}`}>
                    {c.label}<span aria-hidden="true" className="text-ink-soft">{active ? (dir === "asc" ? "▲" : "▼") : "↕"}</span>
                  </Link>
                </th>
              );
            })}
          </tr>
        </thead>
        <tbody>
          {result.rows.map((p) => (
            <tr key={p.id} className="border-b border-rule last:border-0 hover:bg-paper">
              <td className="px-3 py-2">
                <Link className="font-semibold text-lagoon-700 underline-offset-2 hover:underline" href={`/patients/${p.id}`}>{p.familyName}, {p.givenName}</Link>
                {p.status !== "active" ? <span className="ml-2 rounded border border-rule-strong px-1.5 text-xs text-ink-soft">{STATUS_WORDS[p.status]}</span> : null}
                <div className="text-xs text-ink-soft tabular-nums">born {p.dateOfBirth}</div>
              </td>
              <td className="px-3 py-2 tabular-nums">{p.mrn}</td>
              <td className="px-3 py-2 tabular-nums">{p.lastVisit ?? <span className="text-ink-soft">none yet</span>}</td>
              <td className="px-3 py-2 tabular-nums">
                {p.nextDue ? <>{p.nextDue}{p.overdueDays > 0 ? <span className="ml-2 font-semibold text-danger-ink">{p.overdueDays} d overdue</span> : null}</> : p.dateProblem ? <span className="font-semibold text-danger-ink">⚑ Check the visit date</span> : <span className="text-ink-soft">—</span>}
              </td>
              <td className="px-3 py-2">{p.grade ? GRADE_LABEL[p.grade] : <span className="text-ink-soft">—</span>}</td>
              <td className="px-3 py-2 tabular-nums">{p.disagreements > 0 ? <span className="font-semibold text-caution-ink">{p.disagreements}</span> : <span className="text-ink-soft">0</span>}</td>
            </tr>
          ))}
          {result.rows.length === 0 ? <tr><td colSpan={COLUMNS.length} className="px-3 py-6 text-center text-ink-soft">No patients found.</td></tr> : null}
        </tbody>
      </table>
      <nav aria-label="Pages" className="mt-4 flex items-center gap-3">
        {result.page > 1 ? <Link className="inline-flex min-h-11 items-center rounded-md border border-rule-strong px-3 font-semibold" href={link({ page: result.page - 1 })}>← Previous</Link> : null}
        <span className="text-sm text-ink-soft">Page {result.page} of {result.pageCount}</span>
        {result.page < result.pageCount ? <Link className="inline-flex min-h-11 items-center rounded-md border border-rule-strong px-3 font-semibold" href={link({ page: result.page + 1 })}>Next →</Link> : null}
      </nav>
    </AppShell>
  );
}
