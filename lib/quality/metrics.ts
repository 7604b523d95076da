// Practice-standard metrics for one examiner or one site over a period, after the IANS 2016
// practice standards (Hillman RJ et al., J Low Genit Tract Dis 2016;20:283-291; Hillman RJ et al., J Low Genit Tract Dis 2016).
import type { Cytology } from "@/lib/domain/vocab";
import { SEVERITIES } from "@/lib/domain/vocab";
import { dayNumber, type DateInput } from "@/lib/dates/calendar";

export type Severity = (typeof SEVERITIES)[number];

export interface QualityVisit {
  examinerId: string;
  patientId: string;
  date: DateInput;
  cytology?: Cytology;
  durationMin?: number | null;
  pain?: Severity | null;
  bleeding?: Severity | null;
  /** Histological HSIL was found on a biopsy from this visit. */
  histologyHsil?: boolean;
  /**
   * For HSIL cytology: did histology confirm HSIL? Leave unset while pathology is pending. The
   * biopsy may come from a later visit of the same patient, within CYTOLOGY_CONFIRMATION_WINDOW_DAYS.
   */
  cytologyHsilConfirmed?: boolean;
}

export interface QualityInput {
  visits: QualityVisit[];
  /** Period start (inclusive) and end (exclusive), e.g. a calendar year. */
  from: DateInput;
  to: DateInput;
  /** One examiner; omit for the whole site. */
  examinerId?: string;
}

export type MetricKey =
  | "hra_volume"
  | "hsil_cases"
  | "unsatisfactory_cytology"
  | "cytology_hsil_confirmed"
  | "hra_under_15_min"
  | "problematic_pain_or_bleeding";

export interface Metric {
  key: MetricKey;
  label: string;
  /** A count, or a proportion 0..1; null when nothing could be measured. */
  value: number | null;
  numerator: number;
  denominator: number | null;
  threshold: number;
  comparator: ">=" | ">" | "<" | "<=";
  /** null when the value is null. */
  met: boolean | null;
}

/** Moderate or severe counts as problematic. Our choice: the standard does not define the word here. */
const PROBLEMATIC: ReadonlySet<Severity> = new Set(["moderate", "severe"]);

function compare(value: number, comparator: Metric["comparator"], threshold: number): boolean {
  switch (comparator) {
    case ">=":
      return value >= threshold;
    case ">":
      return value > threshold;
    case "<":
      return value < threshold;
    case "<=":
      return value <= threshold;
  }
}

function count(key: MetricKey, label: string, n: number, comparator: Metric["comparator"], threshold: number): Metric {
  return { key, label, value: n, numerator: n, denominator: null, threshold, comparator, met: compare(n, comparator, threshold) };
}

function share(key: MetricKey, label: string, num: number, den: number, comparator: Metric["comparator"], threshold: number): Metric {
  const value = den === 0 ? null : num / den;
  return { key, label, value, numerator: num, denominator: den, threshold, comparator, met: value === null ? null : compare(value, comparator, threshold) };
}

export function qualityMetrics(input: QualityInput): Metric[] {
  const from = dayNumber(input.from);
  const to = dayNumber(input.to);
  const visits = input.visits.filter((v) => {
    const day = dayNumber(v.date);
    return day >= from && day < to && (input.examinerId === undefined || v.examinerId === input.examinerId);
  });

  // A case is a patient: several visits finding HSIL in one person count once.
  const hsilPatients = new Set(visits.filter((v) => v.histologyHsil).map((v) => v.patientId));
  const withCytology = visits.filter((v) => v.cytology !== undefined && v.cytology !== "not_done");
  const unsatisfactory = withCytology.filter((v) => v.cytology === "unsatisfactory").length;
  const hsilCytologyResolved = visits.filter((v) => v.cytology === "hsil" && v.cytologyHsilConfirmed !== undefined);
  const confirmed = hsilCytologyResolved.filter((v) => v.cytologyHsilConfirmed).length;
  const timed = visits.filter((v) => typeof v.durationMin === "number");
  const under15 = timed.filter((v) => (v.durationMin as number) < 15).length;
  const problematic = visits.filter(
    (v) => (v.pain && PROBLEMATIC.has(v.pain)) || (v.bleeding && PROBLEMATIC.has(v.bleeding)),
  ).length;

  return [
    count("hra_volume", "HRAs performed", visits.length, ">=", 50),
    count("hsil_cases", "Patients with histological HSIL identified", hsilPatients.size, ">=", 20),
    share("unsatisfactory_cytology", "Unsatisfactory anal cytology", unsatisfactory, withCytology.length, "<", 0.05),
    share("cytology_hsil_confirmed", "Cytological HSIL confirmed as histological HSIL", confirmed, hsilCytologyResolved.length, ">=", 0.9),
    share("hra_under_15_min", "HRAs under 15 minutes (where timed)", under15, timed.length, ">", 0.9),
    share("problematic_pain_or_bleeding", "Moderate or severe pain or bleeding", problematic, visits.length, "<=", 0.1),
  ];
}

/**
 * How long after an HSIL cytology a biopsy still counts as its histological check (the referral
 * cytology is usually taken before the HRA that biopsies). 180 days is a local default, from memory:
 * IANS 2016 (Hillman RJ et al., J Low Genit Tract Dis 2016) names the metric, not a window, as recalled.
 */
export const CYTOLOGY_CONFIRMATION_WINDOW_DAYS = 180;
