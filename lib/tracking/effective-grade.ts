// Which grade a sighting counts as. Histology, when present, decides; the impression otherwise.
import {
  GRADE_LABEL,
  GRADE_RANK,
  HISTOLOGY_AS_GRADE,
  HISTOLOGY_LABEL,
  type Grade,
  type Histology,
} from "@/lib/domain/vocab";
import { worstHistologyByLesion } from "./histories";

/** Acronyms stay as written; other labels read as ordinary words inside a sentence. */
function inSentence(label: string): string {
  return label === label.toUpperCase() ? label : label.toLowerCase();
}

export const gradeWords = (grade: Grade) => inSentence(GRADE_LABEL[grade]);
export const histologyWords = (histology: Histology) => inSentence(HISTOLOGY_LABEL[histology]);

/** "Diseased" here means anything above benign; benign sightings count as clear. */
export const isDiseased = (grade: Grade) => GRADE_RANK[grade] > GRADE_RANK.benign;
export const isHsilOrWorse = (grade: Grade) => GRADE_RANK[grade] >= GRADE_RANK.hsil;

export interface GradeDecision {
  grade: Grade | null;
  /** How the grade was reached, e.g. "histology HSIL overrides impression LSIL". */
  basis: string;
}

export function decideGrade(impression?: Grade, histology?: Histology | null): GradeDecision {
  if (histology) {
    const grade = HISTOLOGY_AS_GRADE[histology];
    const h = histologyWords(histology);
    if (!impression) return { grade, basis: `histology ${h}` };
    if (impression === grade) return { grade, basis: `histology ${h} confirms the impression` };
    return { grade, basis: `histology ${h} overrides impression ${gradeWords(impression)}` };
  }
  if (impression) return { grade: impression, basis: `impression ${gradeWords(impression)}` };
  return { grade: null, basis: "no grade recorded" };
}

/** A lesion's histology and the grade it counts as, as every screen shows it. */
export interface LesionGrade {
  histology: Histology | null;
  effectiveGrade: Grade;
}

/**
 * The grade each lesion counts as: its worst biopsy result decides over its impression
 * (decideGrade). The one source for the visit page's earlier tracks and the timeline and compare
 * screens, so a track reads the same grade on each.
 */
export function lesionGrades(
  lesions: readonly { id: string; grade: Grade }[],
  biopsies: readonly { lesionId: string | null; histology: Histology | null }[],
): Map<string, LesionGrade> {
  const worst = worstHistologyByLesion(biopsies);
  return new Map(lesions.map((l) => {
    const histology = worst.get(l.id) ?? null;
    return [l.id, { histology, effectiveGrade: decideGrade(l.grade, histology).grade ?? l.grade }];
  }));
}
