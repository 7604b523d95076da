import Link from "next/link";
import { z } from "zod";
import { AppShell } from "@/components/shell/app-shell";
import { listAuditActions, listAuditEvents } from "@/db/queries/audit-trail";
import { listStaff } from "@/db/queries/users";
import { requirePageRole } from "@/lib/auth/page-guard";
import { detailWords, eventWords } from "@/lib/audit/words";
import { readAuditFilter } from "@/lib/validation/audit";
import { ISO_DATE_INPUT } from "@/components/ui/date-input";

export const metadata = { title: "Audit trail" };

const pageSchema = z.object({ page: z.coerce.number().int().min(1).max(100_000).optional().catch(1) });

const input = "mt-1 min-h-11 rounded-md border border-rule-strong bg-panel px-2";

const isId = (v: string) => z.string().uuid().safeParse(v).success;

export default async function AuditPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await requirePageRole(["admin"]);
  const raw = await searchParams;
  const { filter: f, errors } = readAuditFilter(raw);
  const q = { ...f, page: pageSchema.parse(raw).page };
  const [result, actions, staff] = await Promise.all([
    listAuditEvents(user.siteIds, { userId: q.user || undefined, action: q.action || undefined, ...(q.patient ? (isId(q.patient) ? { patientId: q.patient } : { patientMrn: q.patient }) : {}), fromDate: q.from, toDate: q.to, page: q.page }),
    listAuditActions(),
    listStaff(user.siteIds),
  ]);
  const keep = Object.fromEntries(Object.entries({ user: q.user, action: q.action, patient: q.patient, from: q.from, to: q.to }).filter(([, v]) => v)) as Record<string, string>;
  const link = (p: number) => `/audit?${new URLSearchParams({ ...keep, page: String(p) })}`;
  const prefixes = [...new Set(actions.map((a) => a.split(".")[0] + "."))];
  return (
    <AppShell user={user}>
      <h1 className="text-2xl font-bold">Audit trail</h1>
      <p className="mt-1 text-sm text-ink-soft">Every sign-in, read, change and export at your sites. The trail can be read here; nobody can change or remove an entry.</p>
      <form className="mt-4 flex flex-wrap items-end gap-3 rounded-lg border border-rule bg-panel p-4" action="/audit">
        <div>
          <label htmlFor="user" className="block text-sm font-semibold">Person</label>
          <select id="user" name="user" defaultValue={q.user ?? ""} className={input}>
            <option value="">Anyone</option>
            {staff.map((s) => <option key={s.id} value={s.id}>{s.displayName}</option>)}
          </select>
        </div>
        <div>
          <label htmlFor="action" className="block text-sm font-semibold">Event</label>
          <select id="action" name="action" defaultValue={q.action ?? ""} className={input}>
            <option value="">Any event</option>
            <optgroup label="Groups">{prefixes.map((p) => <option key={p} value={p}>{eventWords(p.slice(0, -1)).split(" ")[0]}: every event</option>)}</optgroup>
            <optgroup label="Events">{actions.map((a) => <option key={a} value={a}>{eventWords(a)}</option>)}</optgroup>
          </select>
        </div>
        <div>
          <label htmlFor="patient" className="block text-sm font-semibold">Patient MRN</label>
          <input id="patient" name="patient" aria-invalid={errors.patient ? true : undefined} aria-describedby={errors.patient ? "patient-error" : undefined} defaultValue={q.patient ?? ""} placeholder="any" className={`${input} w-48`} />
          {errors.patient ? <p id="patient-error" className="mt-1 text-sm font-semibold text-danger-ink">{errors.patient}</p> : null}
        </div>
        <div>
          <label htmlFor="from" className="block text-sm font-semibold">From</label>
          <input id="from" name="from" aria-invalid={errors.from ? true : undefined} aria-describedby={errors.from ? "from-error" : undefined} {...ISO_DATE_INPUT} defaultValue={errors.from ? "" : q.from ?? ""} className={input} />
          {errors.from ? <p id="from-error" className="mt-1 text-sm font-semibold text-danger-ink">{errors.from}</p> : null}
        </div>
        <div>
          <label htmlFor="to" className="block text-sm font-semibold">To</label>
          <input id="to" name="to" aria-invalid={errors.to ? true : undefined} aria-describedby={errors.to ? "to-error" : undefined} {...ISO_DATE_INPUT} defaultValue={q.to ?? ""} className={input} />
          {errors.to ? <p id="to-error" className="mt-1 text-sm font-semibold text-danger-ink">{errors.to}</p> : null}
        </div>
        <button className="min-h-11 rounded-md bg-lagoon-600 px-4 font-semibold text-white hover:bg-lagoon-700">Show</button>
        <Link href="/audit" className="inline-flex min-h-11 items-center rounded-md px-3 font-semibold text-lagoon-700 hover:bg-lagoon-50">Clear</Link>
      </form>
      <p className="mt-3 text-sm text-ink-soft">{result.total} {result.total === 1 ? "event" : "events"}, newest first. Times in UTC.</p>
      <table className="mt-2 w-full border-collapse rounded-lg bg-panel text-left text-sm">
        <thead className="border-b border-rule bg-lagoon-50">
          <tr><th className="px-3 py-2">When</th><th className="px-3 py-2">Who</th><th className="px-3 py-2">Event</th><th className="px-3 py-2">Patient</th><th className="px-3 py-2">From</th><th className="px-3 py-2">Detail</th></tr>
        </thead>
        <tbody>
          {result.rows.map((e) => (
            <tr key={e.id} className="border-b border-rule align-top last:border-0">
              <td className="whitespace-nowrap px-3 py-2 tabular-nums">{e.at.toISOString().slice(0, 19).replace("T", " ")}</td>
              <td className="px-3 py-2">{e.userName ?? (e.userId ? <span className="font-mono">{e.userId}</span> : <span className="text-ink-soft">—</span>)}</td>
              <td className={`px-3 py-2 ${e.action.endsWith(".failed") || e.action.endsWith(".rate_limited") ? "font-bold text-danger-ink" : ""}`} title={e.action}>{eventWords(e.action)}</td>
              <td className="px-3 py-2">{e.patientId ? <Link className="text-lagoon-700 underline" href={`/audit?patient=${encodeURIComponent(e.patientMrn ?? e.patientId)}`}>{e.patientMrn ?? e.patientId.slice(0, 8)}</Link> : ""}</td>
              <td className="px-3 py-2 font-mono">{e.ip ?? ""}</td>
              <td className="max-w-md break-words px-3 py-2 text-xs text-ink-soft">{detailWords(e.detail)}</td>
            </tr>
          ))}
          {result.rows.length === 0 ? <tr><td colSpan={6} className="px-3 py-6 text-center text-ink-soft">No events match.</td></tr> : null}
        </tbody>
      </table>
      <nav aria-label="Pages" className="mt-4 flex items-center gap-3">
        {result.page > 1 ? <Link className="min-h-11 rounded-md border border-rule-strong px-3 py-2 font-semibold" href={link(result.page - 1)}>← Newer</Link> : null}
        <span className="text-sm text-ink-soft">Page {result.page} of {result.pageCount}</span>
        {result.page < result.pageCount ? <Link className="min-h-11 rounded-md border border-rule-strong px-3 py-2 font-semibold" href={link(result.page + 1)}>Older →</Link> : null}
      </nav>
    </AppShell>
  );
}
