// LAST terminology (Darragh TM et al., Arch Pathol Lab Med 2012;136:1266-97): two tiers, with the
// old three-grade AIN term kept as an optional qualifier.
import type { AinGrade, P16 } from "@/lib/domain/vocab";

export type LastTier = "lsil" | "hsil";

/**
 * AIN1 -> LSIL; AIN3 -> HSIL; AIN2 -> HSIL when p16 is block positive, LSIL when p16 is negative
 * or not block-type. With no p16 result, AIN2 stays HSIL: LAST places morphological -IN2 in the
 * HSIL tier and uses p16 to move p16-negative cases down (from memory of the LAST paper).
 */
export function lastFromAin(ain: AinGrade, p16: P16 = "not_done"): LastTier {
  switch (ain) {
    case "ain1":
      return "lsil";
    case "ain3":
      return "hsil";
    case "ain2":
      return p16 === "negative" || p16 === "not_block" ? "lsil" : "hsil";
  }
}

const AIN_TEXT: Record<AinGrade, string> = { ain1: "AIN1", ain2: "AIN2", ain3: "AIN3" };

/** Display form, e.g. "HSIL (AIN2, p16 block positive)". */
export function ainLabel(ain: AinGrade, p16: P16 = "not_done"): string {
  const tier = lastFromAin(ain, p16).toUpperCase();
  const stain: Record<P16, string | null> = {
    block_positive: "p16 block positive",
    not_block: "p16 not block-type",
    negative: "p16 negative",
    not_done: null,
  };
  const qualifier = [AIN_TEXT[ain], stain[p16]].filter(Boolean).join(", ");
  return `${tier} (${qualifier})`;
}
