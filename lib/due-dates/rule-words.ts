import type { FollowupRuleKey } from "./rules";

// What the follow-up rules page says about each default. Where a published interval exists it is
// named; where none was found the page says so plainly and asks the site to set its own. The
// notes on where each default comes from stay beside DEFAULT_FOLLOWUP_MONTHS in rules.ts.
export const LOCAL_DEFAULT = "Local default, no published interval; set per site";

export const RULE_WORDS: Record<FollowupRuleKey, { title: string; basis: string }> = {
  suspected_cancer: { title: "Suspected or confirmed cancer", basis: LOCAL_DEFAULT },
  after_hsil_treatment: { title: "After treatment of HSIL (first year)", basis: "Every 3–6 months is common (Goldstone 2005); surveillance HRA within 12 months after treatment (Liu, Sigel, Gaisa 2018)" },
  hsil_untreated: { title: "HSIL not yet treated", basis: "At least every 6 months in ANCHOR (Palefsky 2022); tighter by default" },
  lsil_only: { title: "Low-grade findings only", basis: LOCAL_DEFAULT },
  abnormal_cytology_normal_exam: { title: "Abnormal cytology, normal examination", basis: LOCAL_DEFAULT },
  // Liu 2018's 12 months concern surveillance after treatment, not an untreated clear examination.
  clear_exam: { title: "Clear examination", basis: LOCAL_DEFAULT },
};

/** "1 month", "6 months". */
export function monthsWord(n: number): string {
  return n === 1 ? "1 month" : `${n} months`;
}
