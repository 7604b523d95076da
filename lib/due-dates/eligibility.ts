// Anal cancer screening start, after the IANS 2024 consensus (Stier EA et al., Int J Cancer
// 2024;154:1694-1702; Stier EA et al., Int J Cancer 2024). A suggestion for the clinician, never a decision.
import type { RiskGroup } from "@/lib/domain/vocab";
import { anniversary, dayNumber, isoDate, type DateInput } from "@/lib/dates/calendar";

export interface ScreeningInput {
  riskGroup: RiskGroup;
  dob: DateInput;
  today: DateInput;
  transplantDate?: DateInput;
  /** Date of the vulvar HSIL or vulvar cancer diagnosis. */
  diagnosisDate?: DateInput;
}

export interface ScreeningSuggestion {
  eligibleNow: boolean;
  /** The day screening becomes suggested; null when it cannot be worked out from what is recorded. */
  startDate: string | null;
  reason: string;
  caution: string;
}

export const SCREENING_CAUTION =
  "Suggestion from the IANS 2024 consensus; local guidelines and the treating clinician decide.";

/** Age at which screening starts, for the groups defined by age alone. */
export const SCREENING_START_AGE: Partial<Record<RiskGroup, number>> = {
  msm_tw_hiv: 35, // IANS 2024: MSM and transgender women with HIV from 35
  other_hiv: 45, // IANS 2024: other people with HIV from 45
  msm_tw_no_hiv: 45, // IANS 2024: MSM and transgender women without HIV from 45
  // The three groups below from 45 with shared decision-making: from memory (Stier EA et al., Int J Cancer 2024,
  // the stored abstract was cut off).
  cervical_vaginal_hsil_or_cancer: 45,
  perianal_warts: 45,
  persistent_cervical_hpv16: 45,
};

/** Words for each risk group, for the screens. */
export const GROUP_TEXT: Record<RiskGroup, string> = {
  msm_tw_hiv: "MSM or transgender woman living with HIV",
  other_hiv: "Other person living with HIV",
  msm_tw_no_hiv: "MSM or transgender woman without HIV",
  solid_organ_transplant: "Solid organ transplant recipient",
  vulvar_hsil_or_cancer: "Vulvar HSIL or vulvar cancer",
  cervical_vaginal_hsil_or_cancer: "History of cervical or vaginal HSIL or cancer",
  perianal_warts: "Perianal warts",
  persistent_cervical_hpv16: "Persistent cervical HPV16",
  other: "No screening group",
};

const SHARED_DECISION = new Set<RiskGroup>(["cervical_vaginal_hsil_or_cancer", "perianal_warts", "persistent_cervical_hpv16"]);

function fromStart(startDate: string, today: DateInput, reason: string): ScreeningSuggestion {
  return { eligibleNow: dayNumber(today) >= dayNumber(startDate), startDate, reason, caution: SCREENING_CAUTION };
}

export interface GroupsScreeningInput extends Omit<ScreeningInput, "riskGroup"> {
  /** Every group that applies; IANS 2024 groups overlap (HIV and a transplant, say). */
  riskGroups: readonly RiskGroup[];
}

/**
 * The suggestion for a person in several groups: the earliest start among them. A group that
 * qualifies now without a start date (vulvar HSIL, date not recorded) counts as now; when no group
 * gives a start, the first that asks for a missing date is shown, so the clinician can record it.
 */
export function screeningSuggestionForGroups(input: GroupsScreeningInput): ScreeningSuggestion {
  const { riskGroups, ...rest } = input;
  const each = (riskGroups.length ? riskGroups : (["other"] as const)).map((riskGroup) => screeningSuggestion({ ...rest, riskGroup }));
  const rank = (s: ScreeningSuggestion) => (s.startDate ? dayNumber(s.startDate) : s.eligibleNow ? -Infinity : Infinity);
  const applies = each.filter((s) => s.startDate || s.eligibleNow);
  if (applies.length) return applies.reduce((best, s) => (rank(s) < rank(best) ? s : best));
  const missing = each.filter((_, i) => riskGroups[i] === "solid_organ_transplant");
  return missing[0] ?? each[0]!;
}

export function screeningSuggestion(input: ScreeningInput): ScreeningSuggestion {
  const { riskGroup, dob, today } = input;
  const group = GROUP_TEXT[riskGroup];

  const startAge = SCREENING_START_AGE[riskGroup];
  if (startAge !== undefined) {
    const note = SHARED_DECISION.has(riskGroup) ? "; shared decision-making" : "";
    return fromStart(anniversary(dob, startAge), today, `${group}: screening from age ${startAge}${note}`);
  }

  switch (riskGroup) {
    case "solid_organ_transplant":
      if (!input.transplantDate) {
        return { eligibleNow: false, startDate: null, reason: `${group}: record the transplant date (screening from 10 years after transplant)`, caution: SCREENING_CAUTION };
      }
      return fromStart(anniversary(input.transplantDate, 10), today, `${group}: screening from 10 years after transplant`);
    case "vulvar_hsil_or_cancer": {
      if (!input.diagnosisDate) {
        // The group qualifies at diagnosis; the date only sets the one-year target.
        return { eligibleNow: true, startDate: null, reason: `${group}: screening within 1 year of diagnosis; record the diagnosis date`, caution: SCREENING_CAUTION };
      }
      const by = anniversary(input.diagnosisDate, 1);
      return fromStart(isoDate(input.diagnosisDate), today, `${group}: screening within 1 year of diagnosis (by ${by})`);
    }
    default:
      return { eligibleNow: false, startDate: null, reason: `${group}: no IANS 2024 screening group applies`, caution: SCREENING_CAUTION };
  }
}
