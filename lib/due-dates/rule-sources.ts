// What each follow-up default rests on, shown beside it on the rules page. A source is named
// only for the situation it studied; anything else is marked as a local default.
import type { FollowupRuleKey } from "./rules";

export interface FollowupRuleSource {
  title: string;
  source: string;
}

export const FOLLOWUP_RULE_SOURCES: Record<FollowupRuleKey, FollowupRuleSource> = {
  suspected_cancer: { title: "Suspected or confirmed cancer", source: "Common practice, no source" },
  after_hsil_treatment: { title: "After treatment of HSIL (first year)", source: "Every 3–6 months is common (Goldstone 2005); surveillance HRA within 12 months after treatment (Liu, Sigel, Gaisa 2018)" },
  hsil_untreated: { title: "HSIL not yet treated", source: "At least every 6 months in ANCHOR (Palefsky 2022); tighter by default" },
  lsil_only: { title: "Low-grade findings only", source: "Yearly, from memory" },
  abnormal_cytology_normal_exam: { title: "Abnormal cytology, normal examination", source: "From memory" },
  clear_exam: { title: "Clear examination", source: "Local default, from memory (published 12-month figures concern surveillance after treatment)" },
};
