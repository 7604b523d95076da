import "server-only";
import type { Db, Tx } from "@/db/client";
import { deleteTrackStatuses, readTrackHistory, writeTrackStatuses, type StoredStatus } from "@/db/queries/tracking";
import { trackStatuses as computeStatuses, withMetachronousContext, type TrackHistory } from "@/lib/tracking";
import { trackHistoriesOf, type HistoryRows } from "@/lib/tracking/histories";

type Runner = Db | Tx;

const sameRow = (a: StoredStatus, b: StoredStatus) =>
  a.status === b.status && (a.effectiveGrade ?? null) === (b.effectiveGrade ?? null) && a.reason === b.reason && a.siteId === b.siteId;

const statusRows = (h: TrackHistory, siteId: string): StoredStatus[] =>
  computeStatuses(h.observations, { earlierDiseaseElsewhere: h.earlierDiseaseElsewhere! })
    .filter((s) => s.status !== null)
    .map((s) => ({ trackId: h.trackId, visitId: s.visitId, siteId, status: s.status!, effectiveGrade: s.effectiveGrade, reason: s.reason }));

/** Every track status of one patient worked out from scratch from its history rows, by track. */
export function recomputeTrackStatuses(read: HistoryRows, siteId: string): Map<string, StoredStatus[]> {
  const computed = new Map<string, StoredStatus[]>();
  for (const h of withMetachronousContext(trackHistoriesOf(read))) computed.set(h.trackId, statusRows(h, siteId));
  return computed;
}

/**
 * Works out one patient's track statuses again from the whole history and stores what differs
 * (lib/tracking decides). Statuses come from signed visits only, so the writes that call this are
 * those that change what a signed visit says or make a visit signed: signing, histology results,
 * treatments, track links and checks, visit dates, discarding. A lesion written on a draft changes
 * no status and does not call it (lib/server/lesions.ts).
 * Call it inside the write's transaction, after the write's own statements have been started (it
 * must read what they wrote), holding the patient's status lock (db/queries/patient-lock.ts).
 */
export async function refreshTrackStatuses(run: Runner, patientId: string, siteId: string): Promise<void> {
  const read = await readTrackHistory(run, patientId);
  const computed = recomputeTrackStatuses(read, siteId);
  const storedAt = new Map(read.statuses.map((r) => [`${r.trackId}|${r.visitId}`, r]));
  const upserts: StoredStatus[] = [];
  const keep = new Set<string>();
  for (const rows of computed.values()) {
    for (const r of rows) {
      const key = `${r.trackId}|${r.visitId}`;
      keep.add(key);
      const old = storedAt.get(key);
      if (!old || !sameRow(old, r)) upserts.push(r);
    }
  }
  // Stored rows the recomputation no longer yields are removed. The two sets of rows are
  // disjoint: sent together.
  const stale = new Map<string, string[]>();
  for (const [key, r] of storedAt) {
    if (keep.has(key)) continue;
    stale.set(r.trackId, [...(stale.get(r.trackId) ?? []), r.visitId]);
  }
  await Promise.all([
    ...[...stale].map(([trackId, visitIds]) => deleteTrackStatuses(run, trackId, visitIds)),
    upserts.length ? writeTrackStatuses(run, upserts) : null,
  ]);
}
