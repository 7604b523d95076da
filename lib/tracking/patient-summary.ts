// One patient's tracks at a glance: where each track stands now, when HSIL or worse was last
// found, and which tracks have been treated.
import { TRACK_STATUSES, type Grade, type TrackStatus } from "@/lib/domain/vocab";
import { decideGrade, isDiseased, isHsilOrWorse } from "./effective-grade";
import { trackStatuses, type TrackObservation, type TrackVisitStatus } from "./status";

export interface TrackHistory {
  trackId: string;
  label?: string;
  observations: TrackObservation[];
  /** Left undefined, it is worked out from the patient's other tracks. */
  earlierDiseaseElsewhere?: boolean;
}

export interface TrackNow {
  trackId: string;
  label?: string;
  status: TrackStatus;
  /** The visit that set the current status. */
  visitDate: string;
  effectiveGrade: Grade | null;
  reason: string;
}

export interface PatientSummary {
  countsByStatus: Record<TrackStatus, number>;
  current: TrackNow[];
  /** ISO date of the latest sighting graded HSIL or worse (histology deciding), or null. */
  lastHsilOrWorseDate: string | null;
  treatedTracks: { trackId: string; label?: string; lastTreatedDate: string }[];
  statusesByTrack: Record<string, TrackVisitStatus[]>;
}

/**
 * What the metachronous rule needs of one track, kept per track so a write can work out the other
 * tracks' flags without reading their histories: the date it was first seen, and the date of its
 * earliest non-benign sighting (histology deciding; an ungraded sighting counts as disease).
 */
export interface TrackMarks {
  firstSeen: string | null;
  firstDiseased: string | null;
}

export function trackMarks(track: TrackHistory): TrackMarks {
  let firstSeen: string | null = null;
  let firstDiseased: string | null = null;
  for (const o of track.observations) {
    if (!o.seen) continue;
    if (firstSeen === null || o.visitDate < firstSeen) firstSeen = o.visitDate;
    const g = decideGrade(o.impressionGrade, o.histology).grade;
    if ((g === null || isDiseased(g)) && (firstDiseased === null || o.visitDate < firstDiseased)) firstDiseased = o.visitDate;
  }
  return { firstSeen, firstDiseased };
}

/**
 * The metachronous flag of each track (Liu 2018: disease in a different region after earlier
 * disease): true when another track had a non-benign sighting strictly before this track first
 * appeared. Any grade above benign counts as disease here, matching the rest of the tracking rules.
 */
export function metachronousFlags(marks: ReadonlyMap<string, TrackMarks>): Map<string, boolean> {
  // The two earliest first-diseased dates (of different tracks): for any track, the earliest of
  // the others is the first unless the first is its own.
  let best: { trackId: string; date: string } | null = null;
  let second: string | null = null;
  for (const [trackId, m] of marks) {
    if (m.firstDiseased === null) continue;
    if (best === null || m.firstDiseased < best.date) {
      if (best) second = best.date;
      best = { trackId, date: m.firstDiseased };
    } else if (second === null || m.firstDiseased < second) second = m.firstDiseased;
  }
  const flags = new Map<string, boolean>();
  for (const [trackId, m] of marks) {
    const elsewhere = best && best.trackId !== trackId ? best.date : second;
    flags.set(trackId, m.firstSeen !== null && elsewhere !== null && elsewhere < m.firstSeen);
  }
  return flags;
}

/** Fills in each track's metachronous flag (metachronousFlags) where it is left undefined. */
export function withMetachronousContext(tracks: readonly TrackHistory[]): TrackHistory[] {
  const flags = metachronousFlags(new Map(tracks.map((t) => [t.trackId, trackMarks(t)])));
  return tracks.map((track) => (track.earlierDiseaseElsewhere !== undefined ? track : { ...track, earlierDiseaseElsewhere: flags.get(track.trackId)! }));
}

export function summarizePatient(tracks: readonly TrackHistory[]): PatientSummary {
  const countsByStatus = Object.fromEntries(TRACK_STATUSES.map((s) => [s, 0])) as Record<TrackStatus, number>;
  const current: TrackNow[] = [];
  const statusesByTrack: Record<string, TrackVisitStatus[]> = {};
  const treatedTracks: PatientSummary["treatedTracks"] = [];
  let lastHsilOrWorseDate: string | null = null;

  for (const track of withMetachronousContext(tracks)) {
    const statuses = trackStatuses(track.observations, { earlierDiseaseElsewhere: track.earlierDiseaseElsewhere });
    statusesByTrack[track.trackId] = statuses;
    const latest = [...statuses].reverse().find((s) => s.status !== null);
    if (latest?.status) {
      countsByStatus[latest.status] += 1;
      current.push({
        trackId: track.trackId,
        label: track.label,
        status: latest.status,
        visitDate: latest.visitDate,
        effectiveGrade: latest.effectiveGrade,
        reason: latest.reason,
      });
    }
    for (const s of statuses) {
      if (s.effectiveGrade && isHsilOrWorse(s.effectiveGrade) && (!lastHsilOrWorseDate || s.visitDate > lastHsilOrWorseDate)) {
        lastHsilOrWorseDate = s.visitDate;
      }
    }
    const treatedDates = track.observations.filter((o) => o.treatedAtVisit).map((o) => o.visitDate).sort();
    if (treatedDates.length > 0) {
      treatedTracks.push({ trackId: track.trackId, label: track.label, lastTreatedDate: treatedDates[treatedDates.length - 1] });
    }
  }
  return { countsByStatus, current, lastHsilOrWorseDate, treatedTracks, statusesByTrack };
}
