import { and, asc, eq, inArray, isNotNull } from "drizzle-orm";
import { biopsies, lesions, trackChecks, trackStatuses, treatments, visits, lesionTracks } from "../schema";
import type { Db, Tx } from "../client";
import { HISTOLOGY, type Histology } from "@/lib/domain/vocab";
import { trackStatuses as computeStatuses, withMetachronousContext, type TrackHistory } from "@/lib/tracking";

type Runner = Db | Tx;

const HISTOLOGY_RANK = Object.fromEntries(HISTOLOGY.map((h, i) => [h, i])) as Record<Histology, number>;

/**
 * Every track of one patient with one observation per visit, in five queries whatever the
 * number of visits and lesions. A signed visit is a complete exam: a track without a lesion
 * there was looked for and not found. On a draft only an explicit "not found" counts.
 */
export async function loadTrackHistories(run: Runner, patientId: string): Promise<TrackHistory[]> {
  const visitRows = await run
    .select({ id: visits.id, visitDate: visits.visitDate, status: visits.status })
    .from(visits)
    .where(eq(visits.patientId, patientId))
    .orderBy(asc(visits.visitDate), asc(visits.createdAt));
  const tracks = await run.select({ id: lesionTracks.id, label: lesionTracks.label }).from(lesionTracks).where(eq(lesionTracks.patientId, patientId));
  if (visitRows.length === 0 || tracks.length === 0) return [];
  const visitIds = visitRows.map((v) => v.id);
  const [lesionRows, biopsyRows, treatmentRows, checkRows] = await Promise.all([
    run.select({ id: lesions.id, visitId: lesions.visitId, trackId: lesions.trackId, grade: lesions.grade }).from(lesions).where(and(inArray(lesions.visitId, visitIds), isNotNull(lesions.trackId))),
    run.select({ lesionId: biopsies.lesionId, histology: biopsies.histology }).from(biopsies).where(and(inArray(biopsies.visitId, visitIds), isNotNull(biopsies.histology))),
    run.select({ lesionId: treatments.lesionId, visitId: treatments.visitId }).from(treatments).where(inArray(treatments.visitId, visitIds)),
    run.select({ visitId: trackChecks.visitId, trackId: trackChecks.trackId, outcome: trackChecks.outcome }).from(trackChecks).where(inArray(trackChecks.visitId, visitIds)),
  ]);
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

/** Recomputes and stores every track status of one patient (lib/tracking decides). */
export async function refreshTrackStatuses(run: Runner, patientId: string, siteId: string): Promise<void> {
  const histories = withMetachronousContext(await loadTrackHistories(run, patientId));
  const trackIds = histories.map((h) => h.trackId);
  const rows = histories.flatMap((h) =>
    computeStatuses(h.observations, { earlierDiseaseElsewhere: h.earlierDiseaseElsewhere })
      .filter((s) => s.status !== null)
      .map((s) => ({ trackId: h.trackId, visitId: s.visitId, siteId, status: s.status!, effectiveGrade: s.effectiveGrade, reason: s.reason })),
  );
  if (trackIds.length) await run.delete(trackStatuses).where(inArray(trackStatuses.trackId, trackIds));
  if (rows.length) await run.insert(trackStatuses).values(rows);
}
