import { and, asc, eq, inArray, isNotNull, sql as dsql } from "drizzle-orm";
import { biopsies, lesions, trackChecks, trackStatuses, treatments, visits, lesionTracks } from "../schema";
import type { Db, Tx } from "../client";
import { HISTOLOGY, type Histology } from "@/lib/domain/vocab";
import { trackStatuses as computeStatuses, withMetachronousContext, type TrackHistory } from "@/lib/tracking";

type Runner = Db | Tx;

const HISTOLOGY_RANK = Object.fromEntries(HISTOLOGY.map((h, i) => [h, i])) as Record<Histology, number>;

/**
 * Every track of one patient with one observation per visit, in six queries whatever the
 * number of visits and lesions, sent together (one round trip inside a transaction). A signed
 * visit is a complete exam: a track without a lesion there was looked for and not found. On a
 * draft only an explicit "not found" counts.
 */
export async function loadTrackHistories(run: Runner, patientId: string): Promise<TrackHistory[]> {
  const ofPatient = eq(visits.patientId, patientId);
  const [visitRows, tracks, lesionRows, biopsyRows, treatmentRows, checkRows] = await Promise.all([
    run
      .select({ id: visits.id, visitDate: visits.visitDate, status: visits.status })
      .from(visits)
      .where(ofPatient)
      .orderBy(asc(visits.visitDate), asc(visits.createdAt)),
    run.select({ id: lesionTracks.id, label: lesionTracks.label }).from(lesionTracks).where(eq(lesionTracks.patientId, patientId)),
    run
      .select({ id: lesions.id, visitId: lesions.visitId, trackId: lesions.trackId, grade: lesions.grade })
      .from(lesions)
      .innerJoin(visits, eq(visits.id, lesions.visitId))
      .where(and(ofPatient, isNotNull(lesions.trackId))),
    run
      .select({ lesionId: biopsies.lesionId, histology: biopsies.histology })
      .from(biopsies)
      .innerJoin(visits, eq(visits.id, biopsies.visitId))
      .where(and(ofPatient, isNotNull(biopsies.histology))),
    run.select({ lesionId: treatments.lesionId, visitId: treatments.visitId }).from(treatments).innerJoin(visits, eq(visits.id, treatments.visitId)).where(ofPatient),
    run
      .select({ visitId: trackChecks.visitId, trackId: trackChecks.trackId, outcome: trackChecks.outcome })
      .from(trackChecks)
      .innerJoin(visits, eq(visits.id, trackChecks.visitId))
      .where(ofPatient),
  ]);
  if (visitRows.length === 0 || tracks.length === 0) return [];
  // The worst histology among a lesion's biopsies decides.
  const histologyByLesion = new Map<string, Histology>();
  for (const b of biopsyRows) {
    if (!b.lesionId || !b.histology) continue;
    const prev = histologyByLesion.get(b.lesionId);
    if (!prev || HISTOLOGY_RANK[b.histology] > HISTOLOGY_RANK[prev]) histologyByLesion.set(b.lesionId, b.histology);
  }
  const treatedLesions = new Set(treatmentRows.map((t) => t.lesionId).filter(Boolean));
  const lesionAt = new Map<string, (typeof lesionRows)[number]>();
  for (const l of lesionRows) lesionAt.set(`${l.trackId}|${l.visitId}`, l);
  const checkAt = new Map(checkRows.map((c) => [`${c.trackId}|${c.visitId}`, c.outcome]));

  return tracks.map((t) => ({
    trackId: t.id,
    label: t.label,
    observations: visitRows.map((v) => {
      const l = lesionAt.get(`${t.id}|${v.id}`);
      const check = checkAt.get(`${t.id}|${v.id}`);
      if (l) {
        return { visitId: v.id, visitDate: v.visitDate, seen: true, lookedFor: true, impressionGrade: l.grade, histology: histologyByLesion.get(l.id) ?? null, treatedAtVisit: treatedLesions.has(l.id) };
      }
      return { visitId: v.id, visitDate: v.visitDate, seen: false, lookedFor: check !== undefined || v.status === "signed", treatedAtVisit: check === "treated" };
    }),
  }));
}

type StatusRow = typeof trackStatuses.$inferInsert;
const sameRow = (a: StatusRow, b: StatusRow) =>
  a.status === b.status && (a.effectiveGrade ?? null) === (b.effectiveGrade ?? null) && a.reason === b.reason && a.siteId === b.siteId;

/**
 * Recomputes every track status of one patient (lib/tracking decides; a track's status can depend
 * on the patient's other tracks) and stores the result. Only rows that differ from the stored ones
 * are written, so the table ends exactly as a full rewrite would leave it, but a write that
 * changes one track touches only that track's rows.
 */
export async function refreshTrackStatuses(run: Runner, patientId: string, siteId: string): Promise<void> {
  const [histories, storedRows] = await Promise.all([
    loadTrackHistories(run, patientId),
    run
      .select({ trackId: trackStatuses.trackId, visitId: trackStatuses.visitId, siteId: trackStatuses.siteId, status: trackStatuses.status, effectiveGrade: trackStatuses.effectiveGrade, reason: trackStatuses.reason })
      .from(trackStatuses)
      .innerJoin(lesionTracks, eq(lesionTracks.id, trackStatuses.trackId))
      .where(eq(lesionTracks.patientId, patientId)),
  ]);
  const computed = new Map<string, StatusRow[]>();
  for (const h of withMetachronousContext(histories)) {
    computed.set(
      h.trackId,
      computeStatuses(h.observations, { earlierDiseaseElsewhere: h.earlierDiseaseElsewhere })
        .filter((s) => s.status !== null)
        .map((s) => ({ trackId: h.trackId, visitId: s.visitId, siteId, status: s.status!, effectiveGrade: s.effectiveGrade, reason: s.reason })),
    );
  }
  const stored = new Map<string, StatusRow>();
  for (const r of storedRows) stored.set(`${r.trackId}|${r.visitId}`, r);
  // Rows that are new or differ are written; stored rows of a recomputed track that the
  // recomputation no longer yields are removed. The two sets are disjoint: sent together.
  const upserts: StatusRow[] = [];
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
    ...[...stale].map(([trackId, visitIds]) => run.delete(trackStatuses).where(and(eq(trackStatuses.trackId, trackId), inArray(trackStatuses.visitId, visitIds)))),
    upserts.length
      ? run
          .insert(trackStatuses)
          .values(upserts)
          .onConflictDoUpdate({
            target: [trackStatuses.trackId, trackStatuses.visitId],
            set: { siteId: dsql`excluded.site_id`, status: dsql`excluded.status`, effectiveGrade: dsql`excluded.effective_grade`, reason: dsql`excluded.reason` },
          })
      : null,
  ]);
}

