export { arcLengthH, compareArcs, normalizeHour, overlapLengthH, rotateArc, widenArc, type ClockArc } from "./clock-overlap";
export { decideGrade, gradeWords, histologyWords, isDiseased, isHsilOrWorse, type GradeDecision } from "./effective-grade";
export { DEFAULT_SCORE_OPTIONS, scorePair, type LesionPlace, type PairScore, type ScoreOptions } from "./match-score";
export {
  DEFAULT_MATCH_OPTIONS,
  explainPair,
  matchLesionsToTracks,
  type MatchOptions,
  type MatchResult,
  type NewLesion,
  type PreviousLesion,
  type TrackMatch,
} from "./matcher";
export {
  metachronousFlags,
  summarizePatient,
  trackMarks,
  withMetachronousContext,
  type TrackMarks,
  type PatientSummary,
  type TrackHistory,
  type TrackNow,
} from "./patient-summary";
export {
  trackStatuses,
  type TrackContext,
  type TrackObservation,
  type TrackVisitStatus,
} from "./status";
export { undecidedMessage, undecidedTracks, type EarlierTrack } from "./undecided";
