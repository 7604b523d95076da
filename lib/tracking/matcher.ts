// Suggests which lesion of a new visit continues which earlier track: a one-to-one assignment
// that maximises the summed similarity (Hungarian method, `munkres` package). A suggestion only:
// the clinician confirms or changes it.
import { munkres } from "munkres";
import type { Zone } from "@/lib/domain/vocab";
import { DEFAULT_SCORE_OPTIONS, scorePair, type PairScore, type ScoreOptions } from "./match-score";

export interface PreviousLesion {
  trackId: string;
  label: string;
  startH: number;
  endH: number;
  distStartCm: number;
  distEndCm: number;
  zone: Zone;
}

export interface NewLesion {
  lesionId: string;
  startH: number;
  endH: number;
  distStartCm: number;
  distEndCm: number;
  zone: Zone;
}

export interface TrackMatch {
  trackId: string;
  lesionId: string;
  score: number;
  explanation: string;
}

export interface MatchResult {
  matches: TrackMatch[];
  unmatchedLesionIds: string[];
  unmatchedTrackIds: string[];
}

export interface MatchOptions {
  /** Pairs scoring below this are not suggested; the new lesion starts its own track. */
  minScore: number;
  score: ScoreOptions;
}

export const DEFAULT_MATCH_OPTIONS: MatchOptions = { minScore: 0.35, score: DEFAULT_SCORE_OPTIONS };

// Integer costs make equal scores exactly equal, so float noise (e.g. after rotating every arc)
// cannot flip a tie between two equally good candidates.
const SCALE = 1_000_000;
const quantize = (score: number) => Math.round(score * SCALE);

/** Code-unit order, not locale order, so the result is the same on every machine. */
function byKey<T>(key: (item: T) => string) {
  return (x: T, y: T) => (key(x) < key(y) ? -1 : key(x) > key(y) ? 1 : 0);
}

const percent = (share: number) => `${Math.round(share * 100)}%`;
const zoneWords = (zone: Zone) => zone.replace(/_/g, " ");

export function explainPair(track: PreviousLesion, lesion: NewLesion, s: PairScore): string {
  const whose = s.shorterArc === "a" ? `${track.label}'s arc` : "the new lesion's arc";
  const clock = `overlaps ${percent(s.clockShare)} of ${whose}`;
  const distance =
    s.distanceShare > 0
      ? `distances overlap ${percent(s.distanceShare)}`
      : `distances ${s.distanceGapCm.toFixed(1)} cm apart`;
  const zone = s.sameZone ? "same zone" : `different zone (${zoneWords(track.zone)} vs ${zoneWords(lesion.zone)})`;
  return `${clock}, ${distance}, ${zone}`;
}

export function matchLesionsToTracks(
  previous: readonly PreviousLesion[],
  current: readonly NewLesion[],
  options: Partial<MatchOptions> = {},
): MatchResult {
  const opts = { ...DEFAULT_MATCH_OPTIONS, ...options };
  assertUnique(previous.map((p) => p.trackId), "trackId");
  assertUnique(current.map((c) => c.lesionId), "lesionId");
  const tracks = [...previous].sort(byKey((t) => t.trackId));
  const lesions = [...current].sort(byKey((l) => l.lesionId));
  const minQuantized = quantize(opts.minScore);

  const scores = tracks.map((t) => lesions.map((l) => scorePair(t, l, opts.score)));
  const size = Math.max(tracks.length, lesions.length);
  if (size === 0) return { matches: [], unmatchedLesionIds: [], unmatchedTrackIds: [] };
  // Square cost matrix; padding rows/columns and pairs under the threshold cost the same as
  // leaving both unmatched, so a weak pair never displaces a strong one.
  const cost: number[][] = [];
  for (let r = 0; r < size; r++) {
    const row: number[] = [];
    for (let c = 0; c < size; c++) {
      const q = r < tracks.length && c < lesions.length ? quantize(scores[r][c].score) : 0;
      row.push(SCALE - (q >= minQuantized ? q : 0));
    }
    cost.push(row);
  }

  const matches: TrackMatch[] = [];
  const usedTracks = new Set<string>();
  const usedLesions = new Set<string>();
  for (const [r, c] of munkres(cost)) {
    if (r >= tracks.length || c >= lesions.length) continue;
    const s = scores[r][c];
    if (quantize(s.score) < minQuantized) continue;
    const track = tracks[r];
    const lesion = lesions[c];
    matches.push({
      trackId: track.trackId,
      lesionId: lesion.lesionId,
      score: quantize(s.score) / SCALE,
      explanation: explainPair(track, lesion, s),
    });
    usedTracks.add(track.trackId);
    usedLesions.add(lesion.lesionId);
  }
  matches.sort(byKey((m) => m.trackId));
  return {
    matches,
    unmatchedLesionIds: lesions.map((l) => l.lesionId).filter((id) => !usedLesions.has(id)),
    unmatchedTrackIds: tracks.map((t) => t.trackId).filter((id) => !usedTracks.has(id)),
  };
}

function assertUnique(ids: string[], what: string): void {
  if (new Set(ids).size !== ids.length) throw new Error(`matcher: duplicate ${what}`);
}
