// How much of the circumference a session treated. Staged treatment is planned for
// circumferential disease (Pineda CE et al., J Gastrointest Surg 2007;11:1410-5). The
// per-session limit of half the circumference is from memory, unverified: it is
// configurable and only ever shown as a caution, never enforced.

import { fractionOfCircumference, type Arc } from "@/lib/geometry/arcs";

export const DEFAULT_CAUTION_FRACTION = 0.5;

export type ExtentAssessment = { fraction: number; level: "ok" | "caution"; message: string };

/** Share of the circumference treated, overlapping arcs counted once. */
export function treatedFraction(arcs: readonly Arc[]): number {
  return fractionOfCircumference(arcs);
}

function percent(fraction: number): string {
  return `${Math.round(fraction * 100)}%`;
}

/**
 * Caution from the threshold itself upward: reaching half the circumference already
 * deserves a second look, and a caution costs little.
 */
export function assessExtent(arcs: readonly Arc[], cautionFraction = DEFAULT_CAUTION_FRACTION): ExtentAssessment {
  if (!(cautionFraction > 0 && cautionFraction <= 1)) throw new RangeError("cautionFraction must be in (0, 1]");
  const fraction = treatedFraction(arcs);
  const hours = Math.round(fraction * 12 * 10) / 10;
  const covered = `Treated ${percent(fraction)} of the circumference (${hours} of 12 clock hours).`;
  if (fraction >= cautionFraction - 1e-9) {
    return {
      fraction,
      level: "caution",
      message: `${covered} This reaches the clinic's caution level of ${percent(cautionFraction)}; consider staging treatment per local protocol.`,
    };
  }
  return { fraction, level: "ok", message: covered };
}
