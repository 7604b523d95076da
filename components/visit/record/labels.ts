// Plain words for the record's controlled vocabulary; trade terms (Bethesda, LAST) kept as the trade writes them.
import type { AnaestheticAgent, Modality } from "@/lib/domain/vocab";

export const CYTOLOGY_LABEL = {
  nilm: "NILM (negative)",
  asc_us: "ASC-US",
  asc_h: "ASC-H",
  lsil: "LSIL",
  hsil: "HSIL",
  scc: "Squamous cell carcinoma",
  unsatisfactory: "Unsatisfactory",
  not_done: "Not done",
} as const;

export const HPV_LABEL = {
  not_done: "Not done",
  negative: "Negative",
  hr_positive_16: "High-risk positive, HPV16",
  hr_positive_other: "High-risk positive, other type",
  lr_positive: "Low-risk positive",
} as const;

export const ADEQUACY_LABEL = {
  scj_full: "Squamocolumnar junction seen fully",
  scj_partial: "Squamocolumnar junction seen partially",
  scj_not_seen: "Squamocolumnar junction not seen",
} as const;

export const POSITION_LABEL = { lithotomy: "Lithotomy", prone_jackknife: "Prone jack-knife", left_lateral: "Left lateral (Sims)" } as const;

export const MODALITY_LABEL: Record<Modality, string> = {
  electrocautery: "Electrocautery / hyfrecation",
  infrared_coagulation: "Infrared coagulation",
  laser: "Laser",
  surgical_excision: "Surgical excision",
  topical_imiquimod: "Topical imiquimod",
  topical_fluorouracil: "Topical fluorouracil",
  topical_cidofovir: "Topical cidofovir",
  other: "Other",
};

export const AGENT_LABEL: Record<AnaestheticAgent, string> = { lidocaine: "Lidocaine", bupivacaine: "Bupivacaine" };

export const COMPLICATION_LABEL = { pain: "Pain", bleeding: "Bleeding", other: "Other" } as const;
export const SEVERITY_LABEL = { mild: "Mild", moderate: "Moderate", severe: "Severe" } as const;

export function formatDateTime(iso: string | null | undefined): string {
  if (!iso) return "";
  return new Date(iso).toLocaleString("en-GB", { dateStyle: "medium", timeStyle: "short" });
}

export const round1 = (n: number) => Math.round(n * 10) / 10;
