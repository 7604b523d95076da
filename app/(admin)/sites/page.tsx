import { AppShell } from "@/components/shell/app-shell";
import { SiteForm } from "@/components/admin/site-form";
import { listSitesByIds } from "@/db/queries/sites";
import { requirePageRole } from "@/lib/auth/page-guard";

export const metadata = { title: "Sites" };

export default async function SitesPage() {
  const user = await requirePageRole(["admin"]);
  const sites = await listSitesByIds(user.siteIds);
  return (
    <AppShell user={user}>
      <h1 className="text-2xl font-bold">Sites</h1>
      <p className="mt-1 text-sm text-ink-soft">The clinics you administer. Every patient, visit and export belongs to one site; who works where is set on the Staff page.</p>
      <ul className="mt-4 space-y-4">
        {sites.map((s) => (
          <li key={s.id} className="rounded-lg border border-rule bg-panel p-4">
            <h2 className="mb-2 font-bold">{s.name} <span className="font-normal text-ink-soft">· {s.code}</span></h2>
            <SiteForm site={s} />
          </li>
        ))}
      </ul>
      <h2 className="mt-10 text-xl font-bold">Add a site</h2>
      <p className="mt-1 text-sm text-ink-soft">You become its first member; invite or assign its staff afterwards.</p>
      <div className="mt-3 rounded-lg border border-rule bg-panel p-4"><SiteForm /></div>
    </AppShell>
  );
}
