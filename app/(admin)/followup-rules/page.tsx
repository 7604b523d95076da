import { AppShell } from "@/components/shell/app-shell";
import { listSiteRules } from "@/lib/server/due-dates";
import { requirePageRole } from "@/lib/auth/page-guard";
import { DEFAULT_FOLLOWUP_MONTHS, FOLLOWUP_RULE_KEYS } from "@/lib/due-dates/rules";
import { RULE_WORDS } from "@/lib/due-dates/rule-words";
import { RulesForm } from "./rules-form";

export const metadata = { title: "Follow-up rules" };

export default async function FollowupRulesPage() {
  const user = await requirePageRole(["admin"]);
  const sites = await listSiteRules(user.siteIds);
  const rules = FOLLOWUP_RULE_KEYS.map((key) => ({ key, ...RULE_WORDS[key], defaultMonths: DEFAULT_FOLLOWUP_MONTHS[key] }));
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
