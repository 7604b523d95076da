import "server-only";
import type { Db, Tx } from "@/db/client";
import { deleteTrackStatuses, readTrackHistory, writeTrackStatuses, type StoredStatus } from "@/db/queries/tracking";
import { trackStatuses as computeStatuses, withMetachronousContext } from "@/lib/tracking";
import { trackHistoriesOf, type HistoryRows } from "@/lib/tracking/histories";

type Runner = Db | Tx;

const sameRow = (a: StoredStatus, b: StoredStatus) =>
  a.status === b.status && (a.effectiveGrade ?? null) === (b.effectiveGrade ?? null) && a.reason === b.reason && a.siteId === b.siteId;

/** Every track status of one patient worked out from scratch from its history rows, by track. */
export function recomputeTrackStatuses(read: HistoryRows, siteId: string): Map<string, StoredStatus[]> {
  const computed = new Map<string, StoredStatus[]>();
  for (const h of withMetachronousContext(trackHistoriesOf(read))) {
    computed.set(
      h.trackId,
      computeStatuses(h.observations, { earlierDiseaseElsewhere: h.earlierDiseaseElsewhere })
        .filter((s) => s.status !== null)
        .map((s) => ({ trackId: h.trackId, visitId: s.visitId, siteId, status: s.status!, effectiveGrade: s.effectiveGrade, reason: s.reason })),
    );
  }
  return computed;
}

/**
 * Recomputes every track status of one patient (lib/tracking decides; a track's status can depend
 * on the patient's other tracks) and stores the result. Only rows that differ from the stored ones
 * are written, so the table ends exactly as a full rewrite would leave it, but a write that
 * changes one track touches only that track's rows. Call it inside the write's transaction, after
 * the write's own statements have been started (it must read what they wrote).
 */
export async function refreshTrackStatuses(run: Runner, patientId: string, siteId: string): Promise<void> {
  const read = await readTrackHistory(run, patientId);
  const computed = recomputeTrackStatuses(read, siteId);
  const stored = new Map<string, StoredStatus>();
  for (const r of read.statuses) stored.set(`${r.trackId}|${r.visitId}`, r);
  // Rows that are new or differ are written; stored rows of a recomputed track that the
  // recomputation no longer yields are removed. The two sets are disjoint: sent together.
  const upserts: StoredStatus[] = [];
  const keep = new Set<string>();
  for (const rows of computed.values()) {
    for (const r of rows) {
      const key = `${r.trackId}|${r.visitId}`;
      keep.add(key);
      const old = stored.get(key);
      if (!old || !sameRow(old, r)) upserts.push(r);
    }
  }
  const stale = new Map<string, string[]>();
  for (const [key, r] of stored) {
    if (keep.has(key) || !computed.has(r.trackId)) continue;
    stale.set(r.trackId, [...(stale.get(r.trackId) ?? []), r.visitId]);
  }
  await Promise.all([
    ...[...stale].map(([trackId, visitIds]) => deleteTrackStatuses(run, trackId, visitIds)),
    upserts.length ? writeTrackStatuses(run, upserts) : null,
  ]);
}
