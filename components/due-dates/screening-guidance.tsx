// Screening guidance for intake: when anal cancer screening is suggested for this person under
// the IANS 2024 consensus (lib/due-dates). Shown as guidance; local guidelines and the clinician decide.
import { Caution } from "@/components/ui/caution";
import type { RiskGroup } from "@/lib/domain/vocab";
import { screeningSuggestionForGroups } from "@/lib/due-dates/eligibility";

export interface ScreeningGuidanceProps {
  riskGroups: readonly RiskGroup[];
  dateOfBirth: string;
  /** Transplant date or vulvar HSIL/cancer diagnosis date, where the group needs one. */
  riskDate?: string | null;
  /** ISO date; defaults to today (server clock). */
  today?: string;
}

export function ScreeningGuidance({ riskGroups, dateOfBirth, riskDate, today }: ScreeningGuidanceProps) {
  const s = screeningSuggestionForGroups({
    riskGroups,
    dob: dateOfBirth,
    today: today ?? new Date().toISOString().slice(0, 10),
    transplantDate: riskGroups.includes("solid_organ_transplant") ? riskDate ?? undefined : undefined,
    diagnosisDate: riskGroups.includes("vulvar_hsil_or_cancer") ? riskDate ?? undefined : undefined,
  });
  const title = s.eligibleNow ? "Screening suggested now" : s.startDate ? `Screening suggested from ${s.startDate}` : "No screening start suggested";
  return (
    <section aria-label="Screening guidance" className="space-y-2">
      <div className={`rounded-md border px-4 py-3 ${s.eligibleNow ? "border-lagoon-600 bg-lagoon-50" : "border-rule bg-panel"}`}>
        <p className="font-bold">{s.eligibleNow ? "● " : "○ "}{title}</p>
        <p className="mt-1 text-sm">{s.reason}.</p>
      </div>
      <Caution title="Guidance, not a decision">{s.caution}</Caution>
    </section>
  );
}
