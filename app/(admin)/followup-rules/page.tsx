import { AppShell } from "@/components/shell/app-shell";
import { listSiteRules } from "@/lib/server/due-dates";
import { requirePageRole } from "@/lib/auth/page-guard";
import { DEFAULT_FOLLOWUP_MONTHS, FOLLOWUP_RULE_KEYS } from "@/lib/due-dates/rules";
import { RulesForm } from "./rules-form";

export const metadata = { title: "Follow-up rules" };

const LABEL: Record<(typeof FOLLOWUP_RULE_KEYS)[number], { title: string; source: string }> = {
  suspected_cancer: { title: "Suspected or confirmed cancer", source: "Common practice, no source" },
  after_hsil_treatment: { title: "After treatment of HSIL (first year)", source: "Every 3–6 months is common (Goldstone 2005)" },
  hsil_untreated: { title: "HSIL not yet treated", source: "At least every 6 months in ANCHOR (Palefsky 2022); tighter by default" },
  lsil_only: { title: "Low-grade findings only", source: "Yearly, from memory" },
  abnormal_cytology_normal_exam: { title: "Abnormal cytology, normal examination", source: "From memory" },
  clear_exam: { title: "Clear examination", source: "Within 12 months (Liu, Sigel, Gaisa 2018)" },
};

export default async function FollowupRulesPage() {
  const user = await requirePageRole(["admin"]);
  const sites = await listSiteRules(user.siteIds);
  const rules = FOLLOWUP_RULE_KEYS.map((key) => ({ key, ...LABEL[key], defaultMonths: DEFAULT_FOLLOWUP_MONTHS[key] }));
  return (
    <AppShell user={user}>
      <h1 className="text-2xl font-bold">Follow-up rules</h1>
      <p className="mt-1 max-w-3xl text-sm text-ink-soft">
        Months from the latest visit to the next one, by the latest findings. Leave a field empty to use the default.
        These are scheduling defaults, not treatment advice; a clinician can set a patient&apos;s own date. Every change is kept in the audit trail.
      </p>
      {sites.map((s) => (
        <section key={s.id} className="mt-6 rounded-lg border border-rule bg-panel p-4">
          <h2 className="text-lg font-bold">{s.name}</h2>
          <RulesForm siteId={s.id} rules={rules} current={s.rules} />
        </section>
      ))}
    </AppShell>
  );
}
