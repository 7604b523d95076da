// What changed between two visits of one patient, track by track, for the compare screen.
// Identity comes from the track (the clinician confirmed it); geometry only decides "moved".
import { GRADE_LABEL, GRADE_TIER, type Grade, type TrackCheckOutcome } from "@/lib/domain/vocab";
import { arcMidpointH, describeSite, formatClock, toDisplayHours, type DisplayConvention } from "@/lib/geometry";

export interface DiffLesion {
  id: string;
  /** Null only for a lesion never given a track; it counts as its own identity. */
  trackId: string | null;
  /** How the track is named in words (its track label, else the lesion label). */
  name: string;
  clockStartH: number;
  clockEndH: number;
  distanceStartCm: number;
  distanceEndCm: number;
  /** Histology where present, else the impression (the timeline's effective grade). */
  grade: Grade;
}

export type DiffKind = "new" | "gone" | "grade" | "moved";

export interface VisitDifference {
  kind: DiffKind;
  key: string;
  trackId: string | null;
  name: string;
  before: DiffLesion | null;
  after: DiffLesion | null;
  /** Signed shortest clock shift of the arc midpoint, hours (positive = clockwise in the stored frame). */
  clockShiftH?: number;
  /** Shift of the middle of the distance range, cm (positive = deeper). */
  distanceShiftCm?: number;
  words: string;
}

export interface DiffOptions {
  /** A track "moved" when its arc midpoint shifts at least this far round the clock. */
  minClockShiftH: number;
  /** …or the middle of its distance range shifts at least this far. */
  minDistanceShiftCm: number;
  convention: DisplayConvention;
  /** Outcome recorded at the later visit for a track that was looked for and not drawn. */
  laterChecks?: Readonly<Record<string, TrackCheckOutcome | undefined>>;
  /** Tracks seen at some visit BEFORE the earlier one: absent from it, they come back rather than appear. */
  seenBeforeEarlier?: ReadonlySet<string>;
}

export const DEFAULT_DIFF_OPTIONS: DiffOptions = { minClockShiftH: 1, minDistanceShiftCm: 1, convention: "lithotomy" };

/** Tolerance so a shift of exactly 1 h (or 1 cm) still counts despite float noise. */
const EPS = 1e-9;

/** Shortest signed way round the clock from a to b, in (-6, 6]. */
export function clockShiftH(fromH: number, toH: number): number {
  const d = (((toH - fromH) % 12) + 12) % 12;
  return d > 6 ? d - 12 : d;
}

const keyOf = (l: DiffLesion) => l.trackId ?? `lesion:${l.id}`;
const midCm = (l: DiffLesion) => (l.distanceStartCm + l.distanceEndCm) / 2;
const midH = (l: DiffLesion) => arcMidpointH({ startH: l.clockStartH, endH: l.clockEndH });
const fmtCm = (cm: number) => `${Math.round(Math.abs(cm) * 10) / 10} cm`;
const fmtH = (h: number) => {
  const r = Math.round(Math.abs(h) * 10) / 10;
  return `${r} ${r === 1 ? "hour" : "hours"}`;
};

/**
 * Differences from `earlier` to `later`, ordered new, gone, grade, moved, then by name.
 * A track that both changed grade and moved gives two entries, one for each.
 */
export function diffVisits(earlier: readonly DiffLesion[], later: readonly DiffLesion[], options: Partial<DiffOptions> = {}): VisitDifference[] {
  const opt = { ...DEFAULT_DIFF_OPTIONS, ...options };
  const site = (l: DiffLesion) => describeSite(l.clockStartH, l.clockEndH, l.distanceStartCm, l.distanceEndCm, opt.convention);
  const before = new Map(earlier.map((l) => [keyOf(l), l]));
  const after = new Map(later.map((l) => [keyOf(l), l]));
  const out: VisitDifference[] = [];

  for (const [key, a] of after) {
    if (!before.has(key)) {
      const back = a.trackId !== null && opt.seenBeforeEarlier?.has(a.trackId);
      const words = back
        ? `${a.name} is back: ${GRADE_LABEL[a.grade]} at ${site(a)}; absent at the earlier visit, seen at a visit before it.`
        : `${a.name} is new: ${GRADE_LABEL[a.grade]} at ${site(a)}.`;
      out.push({ kind: "new", key, trackId: a.trackId, name: a.name, before: null, after: a, words });
    }
  }
  for (const [key, b] of before) {
    if (after.has(key)) continue;
    const check = b.trackId ? opt.laterChecks?.[b.trackId] : undefined;
    const how = check === "not_found" ? "looked for and not found" : check === "treated" ? "marked treated" : "not drawn";
    const was = `it was ${GRADE_LABEL[b.grade]} at ${site(b)}.`;
    // Not examined is no finding: the track is not called gone.
    const words = check === "not_examined" ? `${b.name} was not examined at the later visit; ${was}` : `${b.name} is gone at the later visit (${how}); ${was}`;
    out.push({ kind: "gone", key, trackId: b.trackId, name: b.name, before: b, after: null, words });
  }
  for (const [key, b] of before) {
    const a = after.get(key);
    if (!a) continue;
    if (a.grade !== b.grade) {
      // Same LAST tier (condyloma and LSIL): a change of word, not of grade tier.
      const dir =
        GRADE_TIER[a.grade] === GRADE_TIER[b.grade] ? "same tier" : GRADE_TIER[a.grade] > GRADE_TIER[b.grade] ? "higher" : "lower";
      out.push({ kind: "grade", key, trackId: a.trackId, name: a.name, before: b, after: a, words: `${a.name} changed grade from ${GRADE_LABEL[b.grade]} to ${GRADE_LABEL[a.grade]} (${dir}).` });
    }
    const dH = clockShiftH(midH(b), midH(a));
    const dCm = midCm(a) - midCm(b);
    if (Math.abs(dH) + EPS >= opt.minClockShiftH || Math.abs(dCm) + EPS >= opt.minDistanceShiftCm) {
      const parts: string[] = [];
      if (Math.abs(dH) + EPS >= opt.minClockShiftH) {
        const from = formatClock(toDisplayHours(midH(b), opt.convention));
        const to = formatClock(toDisplayHours(midH(a), opt.convention));
        parts.push(`its middle moved ${fmtH(dH)} round the clock (${from} to ${to})`);
      }
      if (Math.abs(dCm) + EPS >= opt.minDistanceShiftCm) parts.push(`${fmtCm(dCm)} ${dCm > 0 ? "deeper" : "nearer the verge"}`);
      out.push({ kind: "moved", key, trackId: a.trackId, name: a.name, before: b, after: a, clockShiftH: dH, distanceShiftCm: dCm, words: `${a.name} moved: ${parts.join(", ")}.` });
    }
  }
  const order: Record<DiffKind, number> = { new: 0, gone: 1, grade: 2, moved: 3 };
  return out.sort((x, y) => order[x.kind] - order[y.kind] || x.name.localeCompare(y.name, "en", { numeric: true }));
}
