// How much of the circumference HSIL-or-worse covers at one visit (histology deciding). Disease over
// more than half the circumference changes the plan in the trade: lesions covering > 50% of the canal
// or perianal region had a higher risk of progression in ANCHOR (Palefsky JM et al., N Engl J Med
// 2022), and circumferential disease is treated in stages (Pineda CE et al., J Gastrointest Surg 2007).
import { fractionOfCircumference, unionArcs } from "@/lib/geometry";
import type { Grade, Histology } from "@/lib/domain/vocab";
import { decideGrade, isHsilOrWorse } from "./effective-grade";

/** More than this share of the circumference counts as wide disease (ANCHOR's "> 50%"). */
export const WIDE_HSIL_FRACTION = 0.5;

export interface ExtentLesion {
  clockStartH: number;
  clockEndH: number;
  grade: Grade;
  histology?: Histology | null;
}

export function hsilExtent(lesions: readonly ExtentLesion[]): { fraction: number; wide: boolean } {
  const arcs = lesions
    .filter((l) => { const g = decideGrade(l.grade, l.histology).grade; return g !== null && isHsilOrWorse(g); })
    .map((l) => ({ startH: l.clockStartH, endH: l.clockEndH }));
  const fraction = fractionOfCircumference(unionArcs(arcs));
  return { fraction, wide: fraction > WIDE_HSIL_FRACTION };
}
