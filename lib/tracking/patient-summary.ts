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

function diseasedDates(track: TrackHistory): string[] {
  return track.observations
    .filter((o) => o.seen)
    .filter((o) => {
      const g = decideGrade(o.impressionGrade, o.histology).grade;
      return g === null || isDiseased(g);
    })
    .map((o) => o.visitDate);
}

function firstSeenDate(track: TrackHistory): string | null {
  const dates = track.observations.filter((o) => o.seen).map((o) => o.visitDate).sort();
  return dates[0] ?? null;
}

/**
 * Fills in the metachronous flag (Liu 2018: disease in a different region after earlier disease):
 * true when another track had a non-benign sighting strictly before this track first appeared.
 * Any grade above benign counts as disease here, matching the rest of the tracking rules.
 */
export function withMetachronousContext(tracks: readonly TrackHistory[]): TrackHistory[] {
  // Each track's earliest diseased sighting, worked out once (not once per pair of tracks): some
  // sighting of another track lies before this one's first exactly when its earliest one does.
  const earliestDisease = tracks.map((t) => {
    let min: string | null = null;
    for (const d of diseasedDates(t)) if (min === null || d < min) min = d;
    return min;
  });
  return tracks.map((track) => {
    if (track.earlierDiseaseElsewhere !== undefined) return track;
    const first = firstSeenDate(track);
    const earlier =
      first !== null &&
      tracks.some((other, i) => other.trackId !== track.trackId && earliestDisease[i] !== null && earliestDisease[i]! < first);
    return { ...track, earlierDiseaseElsewhere: earlier };
  });
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
