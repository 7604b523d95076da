import Link from "next/link";
import { z } from "zod";
import { AppShell } from "@/components/shell/app-shell";
import { OverdueBadge } from "@/components/due-dates/overdue-flag";
import { recordAudit } from "@/lib/server/audit";
import { listSiteRules } from "@/lib/server/due-dates";
import { listClinicians } from "@/db/queries/worklist";
import { listWorklist } from "@/lib/server/worklist";
import { WORKLIST_SORTS, type WorklistSort } from "@/lib/due-dates/worklist";
import { scopeOf } from "@/lib/auth/guard";
import { CLINICAL_ROLES, requirePageRole, pageClientIp } from "@/lib/auth/page-guard";

export const metadata = { title: "Worklist" };

const OVERDUE_CHOICES = [
  { value: "", label: "Due within 30 days or overdue" },
  { value: "1", label: "Overdue" },
  { value: "30", label: "Overdue 30 days or more" },
  { value: "90", label: "Overdue 90 days or more" },
  { value: "180", label: "Overdue 180 days or more" },
] as const;

const searchSchema = z.object({
  clinician: z.string().max(100).optional().catch(undefined),
  site: z.string().uuid().optional().catch(undefined),
  overdue: z.coerce.number().int().min(0).max(3650).optional().catch(undefined),
  sort: z.enum(WORKLIST_SORTS).optional().catch(undefined),
  dir: z.enum(["asc", "desc"]).optional().catch(undefined),
  page: z.coerce.number().int().min(1).max(10_000).optional().catch(1),
});

const input = "mt-1 min-h-11 rounded-md border border-rule-strong bg-panel px-2";

export default async function WorklistPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await requirePageRole(CLINICAL_ROLES);
  const q = searchSchema.parse(await searchParams);
  const [result, clinicians, sites] = await Promise.all([
    listWorklist(scopeOf(user), { clinicianId: q.clinician || undefined, siteId: q.site, minOverdueDays: q.overdue, sort: q.sort, dir: q.dir, page: q.page }),
    listClinicians(user.siteIds),
    listSiteRules(user.siteIds),
  ]);
  await recordAudit({ userId: user.id, ip: await pageClientIp(), action: "worklist.viewed", detail: { filters: { clinician: q.clinician, site: q.site, overdue: q.overdue }, patientIds: result.rows.map((r) => r.patientId) } });
  const keep = Object.fromEntries(Object.entries({ clinician: q.clinician, site: q.site, overdue: q.overdue?.toString(), sort: q.sort, dir: q.dir }).filter(([, v]) => v)) as Record<string, string>;
  const link = (over: Record<string, string>) => `/worklist?${new URLSearchParams({ ...keep, ...over })}`;
  const sortLink = (s: WorklistSort) => link({ sort: s, dir: (q.sort ?? "due") === s && q.dir !== "desc" ? "desc" : "asc", page: "1" });
  const arrow = (s: WorklistSort) => ((q.sort ?? "due") === s ? (q.dir === "desc" ? " ↓" : " ↑") : "");
  const ariaSort = (s: WorklistSort) => ((q.sort ?? "due") === s ? (q.dir === "desc" ? "descending" : "ascending") : undefined);
  const th = "px-3 py-2";
  return (
    <AppShell user={user}>
      <h1 className="text-2xl font-bold">Worklist</h1>
      <p className="mt-1 text-sm text-ink-soft">Patients whose next visit is due. The date comes from the latest visit and the site&apos;s follow-up rules unless a clinician set one.</p>
      <form className="mt-4 flex flex-wrap items-end gap-3 rounded-lg border border-rule bg-panel p-4" action="/worklist">
        <div>
          <label htmlFor="clinician" className="block text-sm font-semibold">Responsible clinician</label>
          <select id="clinician" name="clinician" defaultValue={q.clinician ?? ""} className={input}>
            <option value="">Anyone</option>
            {clinicians.map((c) => <option key={c.id} value={c.id}>{c.displayName}</option>)}
          </select>
        </div>
        {sites.length > 1 ? (
          <div>
            <label htmlFor="site" className="block text-sm font-semibold">Site</label>
            <select id="site" name="site" defaultValue={q.site ?? ""} className={input}>
              <option value="">All my sites</option>
              {sites.map((s) => <option key={s.id} value={s.id}>{s.name}</option>)}
            </select>
          </div>
        ) : null}
        <div>
          <label htmlFor="overdue" className="block text-sm font-semibold">Show</label>
          <select id="overdue" name="overdue" defaultValue={q.overdue?.toString() ?? ""} className={input}>
            {OVERDUE_CHOICES.map((c) => <option key={c.value} value={c.value}>{c.label}</option>)}
          </select>
        </div>
        <button className="min-h-11 rounded-md bg-lagoon-600 px-4 font-semibold text-white hover:bg-lagoon-700">Show</button>
      </form>
      <p className="mt-3 text-sm text-ink-soft">{result.total} {result.total === 1 ? "patient" : "patients"}</p>
      <table className="mt-2 w-full border-collapse rounded-lg bg-panel text-left">
        <thead className="border-b border-rule bg-lagoon-50 text-sm">
          <tr>
            <th className={th} aria-sort={ariaSort("name")}><Link href={sortLink("name")} className="underline-offset-2 hover:underline">Patient{arrow("name")}</Link></th>
            <th className={th}>MRN</th>
            <th className={th} aria-sort={ariaSort("due")}><Link href={sortLink("due")} className="underline-offset-2 hover:underline">Due{arrow("due")}</Link></th>
            <th className={th}>Last visit</th>
            <th className={th}>Why this date</th>
            <th className={th} aria-sort={ariaSort("clinician")}><Link href={sortLink("clinician")} className="underline-offset-2 hover:underline">Clinician{arrow("clinician")}</Link></th>
            {sites.length > 1 ? <th className={th} aria-sort={ariaSort("site")}><Link href={sortLink("site")} className="underline-offset-2 hover:underline">Site{arrow("site")}</Link></th> : null}
          </tr>
        </thead>
        <tbody>
          {result.rows.map((r) => (
            <tr key={r.patientId} className="border-b border-rule last:border-0 hover:bg-paper">
              <td className="px-3 py-2"><Link className="font-semibold text-lagoon-700 underline-offset-2 hover:underline" href={`/patients/${r.patientId}`}>{r.familyName}, {r.givenName}</Link></td>
              <td className="px-3 py-2 tabular-nums">{r.mrn}</td>
              <td className="px-3 py-2 tabular-nums"><span className="mr-2">{r.dueDate}</span><OverdueBadge overdueDays={r.overdueDays} dateProblem={r.dateProblem} /></td>
              <td className="px-3 py-2 tabular-nums">{r.lastVisitDate}</td>
              <td className="px-3 py-2 text-sm">{r.ruleKey === "clinician_override" && !r.dateProblem ? <span><strong>Clinician&apos;s date:</strong> {r.reason}</span> : r.reason}</td>
              <td className="px-3 py-2">{r.clinicianName ?? <span className="text-ink-soft">Not set</span>}</td>
              {sites.length > 1 ? <td className="px-3 py-2">{r.siteName}</td> : null}
            </tr>
          ))}
          {result.rows.length === 0 ? <tr><td colSpan={7} className="px-3 py-6 text-center text-ink-soft">Nobody is due with these filters.</td></tr> : null}
        </tbody>
      </table>
      <nav aria-label="Pages" className="mt-4 flex items-center gap-3">
        {result.page > 1 ? <Link className="min-h-11 rounded-md border border-rule-strong px-3 py-2 font-semibold" href={link({ page: String(result.page - 1) })}>← Previous</Link> : null}
        <span className="text-sm text-ink-soft">Page {result.page} of {result.pageCount}</span>
        {result.page < result.pageCount ? <Link className="min-h-11 rounded-md border border-rule-strong px-3 py-2 font-semibold" href={link({ page: String(result.page + 1) })}>Next →</Link> : null}
      </nav>
    </AppShell>
  );
}
