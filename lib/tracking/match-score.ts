// How alike two mapped lesions are, in [0, 1], for suggesting which new lesion continues which
// track. The weights are our own choice (no published scoring exists); they are exported so the
// clinic can tune them, and every suggestion is confirmed by a clinician.
import type { Zone } from "@/lib/domain/vocab";
import { compareArcs } from "./clock-overlap";

export interface LesionPlace {
  startH: number;
  endH: number;
  distStartCm: number;
  distEndCm: number;
  zone: Zone;
}

export interface ScoreOptions {
  /** Arcs shorter than this are widened about their middle before comparing. */
  minArcH: number;
  /** Distance ranges shorter than this are widened about their middle. */
  minRangeCm: number;
  /** Distance estimates at HRA are rough: ranges this far apart still earn partial credit. */
  distanceToleranceCm: number;
  weights: { base: number; distance: number; zone: number };
}

export const DEFAULT_SCORE_OPTIONS: ScoreOptions = {
  minArcH: 0.5,
  minRangeCm: 0.5,
  distanceToleranceCm: 1,
  weights: { base: 0.55, distance: 0.3, zone: 0.15 },
};

export interface PairScore {
  score: number;
  /** Overlap as a share of the shorter (widened) arc. */
  clockShare: number;
  /** Which arc was the shorter one: the track's ("a") or the new lesion's ("b"). */
  shorterArc: "a" | "b";
  clock: number;
  /** Overlap as a share of the shorter distance range; 0 when they do not meet. */
  distanceShare: number;
  distanceGapCm: number;
  distance: number;
  sameZone: boolean;
}

/** Blend of "fits inside" (size changes between visits are normal) and a Jaccard-like share. */
function likeness(overlap: number, lengthA: number, lengthB: number): { share: number; value: number } {
  const shorter = Math.min(lengthA, lengthB);
  const union = lengthA + lengthB - overlap;
  const share = shorter > 0 ? overlap / shorter : 0;
  const jaccard = union > 0 ? overlap / union : 0;
  return { share, value: 0.75 * share + 0.25 * jaccard };
}

function widenRange(fromCm: number, toCm: number, minCm: number): [number, number] {
  const lo = Math.min(fromCm, toCm);
  const hi = Math.max(fromCm, toCm);
  if (hi - lo >= minCm) return [lo, hi];
  const mid = (lo + hi) / 2;
  return [mid - minCm / 2, mid + minCm / 2];
}

/**
 * Score of a track's last lesion (a) against a new lesion (b). Symmetric in a and b.
 * Clock overlap scales the whole score rather than being one term of a sum: with a plain sum a
 * lesion on the opposite wall at the same depth and zone, or the same clock hour at the far end of
 * the canal, would clear the threshold. Distance and zone then weight how good the match is.
 */
export function scorePair(a: LesionPlace, b: LesionPlace, options: ScoreOptions = DEFAULT_SCORE_OPTIONS): PairScore {
  const arcs = compareArcs(a, b, options.minArcH);
  const clockLike = likeness(arcs.overlapH, arcs.lengthAH, arcs.lengthBH);
  const [a0, a1] = widenRange(a.distStartCm, a.distEndCm, options.minRangeCm);
  const [b0, b1] = widenRange(b.distStartCm, b.distEndCm, options.minRangeCm);
  const overlapCm = Math.max(0, Math.min(a1, b1) - Math.max(a0, b0));
  const gapCm = Math.max(0, Math.max(a0, b0) - Math.min(a1, b1));
  const distLike = likeness(overlapCm, a1 - a0, b1 - b0);
  // Touching ranges earn half credit; beyond the tolerance the pair is not the same lesion.
  const distance =
    overlapCm > 0 ? 0.5 + 0.5 * distLike.value : 0.5 * Math.max(0, 1 - gapCm / options.distanceToleranceCm);
  const sameZone = a.zone === b.zone;
  const { base, distance: wDist, zone: wZone } = options.weights;
  const weighted = (base + wDist * distance + wZone * (sameZone ? 1 : 0)) / (base + wDist + wZone);
  const score = distance === 0 ? 0 : clockLike.value * weighted;
  return {
    score: Math.min(1, Math.max(0, score)),
    clockShare: clockLike.share,
    shorterArc: arcs.lengthAH <= arcs.lengthBH ? "a" : "b",
    clock: clockLike.value,
    distanceShare: distLike.share,
    distanceGapCm: gapCm,
    distance,
    sameZone,
  };
}
