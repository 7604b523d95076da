import Link from "next/link";
import { AppShell } from "@/components/shell/app-shell";
import { QualityTable } from "@/components/research/quality-table";
import { recordAudit } from "@/lib/server/audit";
import { loadQualityPanel } from "@/lib/server/research";
import { scopeOf } from "@/lib/auth/guard";
import { requirePageRole, pageClientIp } from "@/lib/auth/page-guard";
import { qualityQuerySchema } from "@/lib/validation/research";

export const metadata = { title: "Clinic quality" };
export const dynamic = "force-dynamic";

/** IANS 2016 practice-standard metrics per site and examiner, for admins and reviewers. */
export default async function QualityPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await requirePageRole(["admin", "reviewer"]);
  const thisYear = new Date().getUTCFullYear();
  const parsed = qualityQuerySchema.safeParse({ year: (await searchParams).year ?? thisYear });
  const year = parsed.success ? parsed.data.year : thisYear;
  const panel = await loadQualityPanel(scopeOf(user), year);
  await recordAudit({ userId: user.id, ip: await pageClientIp(), action: "quality.read", detail: { year } });
  return (
    <AppShell user={user}>
      <h1 className="text-2xl font-bold">Clinic quality, {year}</h1>
      <p className="mt-1 text-sm text-ink-soft">
        Signed visits measured against the IANS 2016 practice standards (Hillman RJ et al., J Low Genit Tract Dis 2016;20:283–291). Moderate or severe pain or bleeding counts as problematic; rates appear only where something was recorded.
      </p>
      <nav aria-label="Year" className="mt-3 flex flex-wrap gap-2">
        {[0, 1, 2, 3].map((k) => thisYear - k).map((y) => (
          <Link key={y} href={`/quality?year=${y}`} aria-current={y === year ? "page" : undefined} className={`inline-flex min-h-11 items-center rounded-md border px-3 font-semibold ${y === year ? "border-lagoon-700 bg-lagoon-50" : "border-rule-strong hover:bg-lagoon-50"}`}>{y}</Link>
        ))}
      </nav>
      <p className="mt-2 text-sm text-ink-soft" data-figures-as-of={panel.asOf}>
        Figures as of {panel.asOf.slice(0, 10)} {panel.asOf.slice(11, 16)} UTC; they are worked out again when a page load finds them over {panel.maxAgeMinutes} minutes old.
        {panel.refreshing ? " Newer figures are being worked out now: reload in a minute." : ""}
      </p>
      {panel.sites.length === 0 ? <p className="mt-6 text-ink-soft">No signed visits at your sites in {year}.</p> : null}
      {panel.sites.map((site) => (
        <section key={site.siteId} className="mt-6" aria-labelledby={`site-${site.siteId}`}>
          <h2 id={`site-${site.siteId}`} className="text-lg font-bold">{site.siteCode}</h2>
          <QualityTable groups={[{ label: `${site.siteCode}, whole site`, metrics: site.site }, ...site.examiners]} />
        </section>
      ))}
    </AppShell>
  );
}
