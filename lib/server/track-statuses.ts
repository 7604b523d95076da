import "server-only";
import type { Db, Tx } from "@/db/client";
import {
  deleteTrackStatuses, readTrackHistory, writeTrackStatuses, writeTrackSummaries, type StoredStatus, type TrackHistoryRead, type TrackSummaryRow,
} from "@/db/queries/tracking";
import { metachronousFlags, trackMarks, trackStatuses as computeStatuses, withMetachronousContext, type TrackHistory, type TrackMarks } from "@/lib/tracking";
import { trackHistoriesOf, type HistoryRows } from "@/lib/tracking/histories";

type Runner = Db | Tx;

const sameRow = (a: StoredStatus, b: StoredStatus) =>
  a.status === b.status && (a.effectiveGrade ?? null) === (b.effectiveGrade ?? null) && a.reason === b.reason && a.siteId === b.siteId;

const statusRows = (h: TrackHistory, siteId: string, earlierDiseaseElsewhere: boolean): StoredStatus[] =>
  computeStatuses(h.observations, { earlierDiseaseElsewhere })
    .filter((s) => s.status !== null)
    .map((s) => ({ trackId: h.trackId, visitId: s.visitId, siteId, status: s.status!, effectiveGrade: s.effectiveGrade, reason: s.reason }));

/** Every track status of one patient worked out from scratch from its history rows, by track. */
export function recomputeTrackStatuses(read: HistoryRows, siteId: string): Map<string, StoredStatus[]> {
  const computed = new Map<string, StoredStatus[]>();
  for (const h of withMetachronousContext(trackHistoriesOf(read))) computed.set(h.trackId, statusRows(h, siteId, h.earlierDiseaseElsewhere!));
  return computed;
}

/**
 * Works out one patient's track statuses again and stores what differs (lib/tracking decides).
 * Call it inside the write's transaction, after the write's own statements have been started (it
 * must read what they wrote), holding the patient's status lock (db/queries/patient-lock.ts).
 *
 * `touched`: the tracks whose own history the write changed (a lesion's track, before and after a
 * relink). Then only those are read and recomputed, plus any other track whose metachronous flag
 * the change turns over, found from the stored per-track summaries (first sighting, first disease)
 * without reading those tracks' histories. Left out (visit dates, signing, biopsies, treatments,
 * track links), or when some track has no summary yet, every track is recomputed. Either way the
 * table ends exactly as a full rewrite would leave it (tests/integration/status-incremental.test.ts).
 */
export async function refreshTrackStatuses(run: Runner, patientId: string, siteId: string, touched?: readonly (string | null | undefined)[]): Promise<void> {
  const only = touched ? [...new Set(touched.filter((t): t is string => Boolean(t)))] : null;
  const read = await readTrackHistory(run, patientId, only);
  if (only && read.summaries.some((s) => !s.stored && !only.includes(s.trackId))) return refreshTrackStatuses(run, patientId, siteId);

  const histories = trackHistoriesOf(read);
  const fresh = new Map(histories.map((h) => [h.trackId, trackMarks(h)]));
  const marks = new Map<string, TrackMarks>();
  const storedFlag = new Map<string, boolean | undefined>();
  for (const s of read.summaries) {
    storedFlag.set(s.trackId, s.stored?.earlierDiseaseElsewhere);
    marks.set(s.trackId, fresh.get(s.trackId) ?? s.stored ?? { firstSeen: null, firstDiseased: null });
  }
  const flags = metachronousFlags(marks);
  // Tracks the write did not touch whose flag it turned over: read and recomputed too (rare: the
  // write moved a track's first disease across another track's first sighting).
  const turned = only ? [...marks.keys()].filter((t) => !fresh.has(t) && flags.get(t) !== storedFlag.get(t)) : [];
  const statuses = [...read.statuses];
  if (turned.length) {
    const more = await readTrackHistory(run, patientId, turned);
    histories.push(...trackHistoriesOf(more));
    statuses.push(...more.statuses);
  }
  await store(run, siteId, histories, flags, statuses, read);
}

async function store(run: Runner, siteId: string, histories: TrackHistory[], flags: Map<string, boolean>, stored: StoredStatus[], read: TrackHistoryRead) {
  const storedAt = new Map(stored.map((r) => [`${r.trackId}|${r.visitId}`, r]));
  const storedSummary = new Map(read.summaries.map((s) => [s.trackId, s.stored]));
  const upserts: StoredStatus[] = [];
  const summaries: TrackSummaryRow[] = [];
  const keep = new Set<string>();
  const recomputed = new Set<string>();
  for (const h of histories) {
    recomputed.add(h.trackId);
    const flag = flags.get(h.trackId) ?? false;
    for (const r of statusRows(h, siteId, flag)) {
      const key = `${r.trackId}|${r.visitId}`;
      keep.add(key);
      const old = storedAt.get(key);
      if (!old || !sameRow(old, r)) upserts.push(r);
    }
    const m = trackMarks(h);
    const was = storedSummary.get(h.trackId);
    if (!was || was.firstSeen !== m.firstSeen || was.firstDiseased !== m.firstDiseased || was.earlierDiseaseElsewhere !== flag) {
      summaries.push({ trackId: h.trackId, siteId, ...m, earlierDiseaseElsewhere: flag });
    }
  }
  // Stored rows of a recomputed track that the recomputation no longer yields are removed. The
  // three sets of rows are disjoint: sent together.
  const stale = new Map<string, string[]>();
  for (const [key, r] of storedAt) {
    if (keep.has(key) || !recomputed.has(r.trackId)) continue;
    stale.set(r.trackId, [...(stale.get(r.trackId) ?? []), r.visitId]);
  }
  await Promise.all([
    ...[...stale].map(([trackId, visitIds]) => deleteTrackStatuses(run, trackId, visitIds)),
    upserts.length ? writeTrackStatuses(run, upserts) : null,
    summaries.length ? writeTrackSummaries(run, summaries) : null,
  ]);
}
