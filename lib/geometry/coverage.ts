// How far treated arcs cover a lesion's clock extent: the one definition that decides whether a
// treatment entered as arcs treats a lesion (lib/validation/treatments.ts, treatedLesions).
//   full    the arcs together (their union) reach every hour of the extent, ends included;
//   partial they share some length with it but leave part of it untreated;
//   none    they share no length (arcs that only touch the extent at an end do not reach it).
// A point lesion (start = end) is covered fully by an arc that contains its hour, else not at all.
// Depth (cm from the verge) is not compared: a treated arc is recorded by clock position only.

import { arcLengthH, containsHour, overlapH, unionArcs, type Arc } from "./arcs";

export type Coverage = "full" | "partial" | "none";

/** Below this many hours a shortfall is rounding, not an untreated strip (the editor's grid is 0.5 h). */
const EPS_H = 1e-6;

export function arcCoverage(extent: Arc, treated: readonly Arc[]): Coverage {
  if (treated.length === 0) return "none";
  const union = unionArcs(treated);
  const length = arcLengthH(extent);
  if (length <= EPS_H) return union.some((u) => containsHour(u, extent.startH)) ? "full" : "none";
  const shared = union.reduce((sum, u) => sum + overlapH(extent, u), 0);
  if (shared >= length - EPS_H) return "full";
  return shared > EPS_H ? "partial" : "none";
}
