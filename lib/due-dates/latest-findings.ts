// Turns what the latest visit recorded into the summary the follow-up rules read.
import type { Cytology, Grade, Histology } from "@/lib/domain/vocab";
import { addMonths, dayNumber, type DateInput } from "@/lib/dates/calendar";
import type { FindingLesion, FindingsSummary } from "./rules";

export interface TreatmentSeen {
  visitDate: DateInput;
  /** The treated lesion's impression and histology; null when the treatment names no lesion. */
  grade: Grade | null;
  histology: Histology | null;
}

export interface LatestVisitFacts {
  visitDate: DateInput;
  lesions: FindingLesion[];
  /** Effective grades of the tracks at this visit (tracking statuses, histology already applied). */
  trackGrades: Grade[];
  cytology: Cytology;
  /** Treatments of any visit of the patient. */
  treatments: TreatmentSeen[];
}

/**
 * Post-treatment surveillance lasts for the year after an HSIL treatment (surveillance HRA
 * within 12 months: Liu Y, Sigel K, Gaisa MM, Papillomavirus Res 2018;5:S9). Our reading of it,
 * not a published rule; a site changes the interval, not the window.
 */
export const SURVEILLANCE_WINDOW_MONTHS = 12;

function treatedHsil(t: TreatmentSeen): boolean {
  // Office treatment is for HSIL (Liu Y et al., Papillomavirus Res 2018); a treatment without a lesion is taken as one.
  if (t.histology) return t.histology === "hsil" || t.histology === "scc";
  return t.grade === null || t.grade === "hsil" || t.grade === "suspected_cancer";
}

export function summariseLatestFindings(facts: LatestVisitFacts): FindingsSummary {
  const last = dayNumber(facts.visitDate);
  const windowStart = dayNumber(addMonths(facts.visitDate, -SURVEILLANCE_WINDOW_MONTHS));
  const recentHsilTreatment = facts.treatments.some((t) => {
    const d = dayNumber(t.visitDate);
    return d <= last && d > windowStart && treatedHsil(t);
  });
  return {
    lesions: [...facts.lesions, ...facts.trackGrades.map((grade) => ({ grade }))],
    treatedHsil: recentHsilTreatment,
    cytology: facts.cytology,
  };
}
