// When the next examination is due. The intervals are defaults a site can change; they are
// guidance for scheduling, and the clinician's own date always wins.
import { z } from "zod";
import { GRADE_RANK, GRADE_TIER, HISTOLOGY_AS_GRADE, type Cytology, type Grade, type Histology } from "@/lib/domain/vocab";
import { addMonths, daysBetween, isoDate, type DateInput } from "@/lib/dates/calendar";

export const FOLLOWUP_RULE_KEYS = [
  "suspected_cancer",
  "after_hsil_treatment",
  "hsil_untreated",
  "lsil_only",
  "abnormal_cytology_normal_exam",
  "clear_exam",
] as const;
export type FollowupRuleKey = (typeof FOLLOWUP_RULE_KEYS)[number];
export type FollowupRuleTable = Record<FollowupRuleKey, number>;

/** Default interval in months for each situation. */
export const DEFAULT_FOLLOWUP_MONTHS: FollowupRuleTable = {
  // A suspected cancer needs biopsy and referral, not surveillance: review within a month.
  // Common practice, no source.
  suspected_cancer: 1,
  // Follow-up every 3-6 months after treatment is common (Goldstone SE, Dis Colon Rectum 2005);
  // histological resolution is judged weeks after treatment (Richel O, Lancet Oncol 2013).
  // The lower bound is the default; the choice of 3 is ours. Liu Y et al. (Papillomavirus Res 2018;5:S9)
  // give surveillance HRA within 12 months after treatment: the outer bound for this rule.
  after_hsil_treatment: 3,
  // ANCHOR examined both arms at least every 6 months (Palefsky JM, N Engl J Med 2022);
  // an untreated HSIL usually waits for treatment, so we default tighter. Common practice, no source.
  hsil_untreated: 3,
  // Yearly review of low-grade disease: from memory, common practice, no single source.
  lsil_only: 12,
  // Abnormal cytology with a normal HRA is re-examined sooner than a clear result: from memory.
  abnormal_cytology_normal_exam: 6,
  // Local default, from memory. Liu 2018's "within 12 months" is surveillance after treatment and
  // is not a source for an untreated clear examination.
  clear_exam: 12,
};

const months = z.number().int().min(1).max(36);

/** A site's table: any subset of the rules, whole months from 1 to 36. */
export const siteRuleTableSchema = z
  .object({
    suspected_cancer: months.optional(),
    after_hsil_treatment: months.optional(),
    hsil_untreated: months.optional(),
    lsil_only: months.optional(),
    abnormal_cytology_normal_exam: months.optional(),
    clear_exam: months.optional(),
  })
  .strict();
export type SiteRuleTable = z.infer<typeof siteRuleTableSchema>;

export interface FindingLesion {
  grade: Grade;
  histology?: Histology | null;
}

export interface FindingsSummary {
  lesions: FindingLesion[];
  /** An HSIL was treated at this visit or is under post-treatment surveillance. */
  treatedHsil: boolean;
  cytology?: Cytology;
}

export interface NextDueInput {
  lastVisitDate: DateInput;
  findings: FindingsSummary;
  siteRules?: SiteRuleTable;
  clinicianOverride?: { date: DateInput; reason: string };
}

export interface NextDue {
  dueDate: string;
  ruleKey: FollowupRuleKey | "clinician_override";
  reason: string;
}

/** The worst grade of the visit; a lesion's histology, where there is one, replaces its impression. */
export function worstGrade(lesions: FindingLesion[]): Grade | null {
  let worst: Grade | null = null;
  for (const lesion of lesions) {
    const grade = lesion.histology ? HISTOLOGY_AS_GRADE[lesion.histology] : lesion.grade;
    if (worst === null || GRADE_RANK[grade] > GRADE_RANK[worst]) worst = grade;
  }
  return worst;
}

const ABNORMAL_CYTOLOGY: ReadonlySet<Cytology> = new Set(["asc_us", "asc_h", "lsil", "hsil", "scc"]);

const REASON: Record<FollowupRuleKey, string> = {
  suspected_cancer: "Suspected or confirmed cancer: biopsy and referral",
  after_hsil_treatment: "Surveillance after HSIL treatment",
  hsil_untreated: "HSIL not yet treated",
  lsil_only: "Low-grade findings only",
  abnormal_cytology_normal_exam: "Abnormal cytology without a visible lesion",
  clear_exam: "No lesion and no abnormal cytology",
};

export function selectRule(findings: FindingsSummary): FollowupRuleKey {
  const worst = worstGrade(findings.lesions);
  if (worst === "suspected_cancer") return "suspected_cancer";
  if (findings.treatedHsil) return "after_hsil_treatment";
  if (worst === "hsil") return "hsil_untreated";
  // Condyloma and LSIL are one low-grade tier (LAST; GRADE_TIER), so both follow the LSIL interval.
  if (worst !== null && GRADE_TIER[worst] === GRADE_TIER.lsil) return "lsil_only";
  if (findings.cytology && ABNORMAL_CYTOLOGY.has(findings.cytology)) return "abnormal_cytology_normal_exam";
  return "clear_exam";
}

export function nextDue(input: NextDueInput): NextDue {
  if (input.clinicianOverride) {
    const reason = input.clinicianOverride.reason.trim();
    if (!reason) throw new Error("A clinician's date needs a reason");
    return { dueDate: isoDate(input.clinicianOverride.date), ruleKey: "clinician_override", reason };
  }
  const ruleKey = selectRule(input.findings);
  const site = input.siteRules ? siteRuleTableSchema.parse(input.siteRules) : {};
  const intervalMonths = site[ruleKey] ?? DEFAULT_FOLLOWUP_MONTHS[ruleKey];
  const source = site[ruleKey] === undefined ? "default" : "site rule";
  return {
    dueDate: addMonths(input.lastVisitDate, intervalMonths),
    ruleKey,
    reason: `${REASON[ruleKey]}: ${intervalMonths} month${intervalMonths === 1 ? "" : "s"} (${source})`,
  };
}

/** Days past the due date; 0 while not yet overdue. */
export function overdueDays(dueDate: DateInput, today: DateInput): number {
  return Math.max(0, daysBetween(dueDate, today));
}
