import "server-only";
// Statements of track statuses: a patient's track history as rows, and the stored statuses
// written or removed. What the statuses are is decided in lib/tracking, by lib/server/track-statuses.ts.
import { and, eq, inArray, isNotNull, sql as dsql } from "drizzle-orm";
import { biopsies, lesions, trackChecks, trackStatuses, treatments, visits, lesionTracks } from "../schema";
import { prepared, type Db, type Tx } from "../client";
import { rowsOf } from "./json-rows";
import { pgArrayLiteral } from "./scope";
import type { Histology } from "@/lib/domain/vocab";
import type { HistoryRows } from "@/lib/tracking/histories";

type Runner = Db | Tx;

type Visit = typeof visits.$inferSelect;
type Lesion = typeof lesions.$inferSelect;

const patientParam = dsql.placeholder("patientId");
const ofPatient = eq(visits.patientId, patientParam);
// A patient's track history and the statuses stored now, in one statement built once: each part
// is a JSON array of rows, so the driver parses one value per part.
const historyOfPatient = prepared((run) =>
    run
      .select({
        visits: rowsOf<[string, Visit["visitDate"], Visit["status"]]>([visits.id, visits.visitDate, visits.status], dsql`from ${visits} where ${ofPatient}`, dsql`${visits.visitDate}, ${visits.createdAt}`),
        tracks: rowsOf<[string, string]>([lesionTracks.id, lesionTracks.label], dsql`from ${lesionTracks} where ${eq(lesionTracks.patientId, patientParam)}`),
        lesions: rowsOf<[string, string, string, Lesion["grade"]]>(
          [lesions.id, lesions.visitId, lesions.trackId, lesions.grade],
          dsql`from ${lesions} inner join ${visits} on ${eq(visits.id, lesions.visitId)} where ${and(ofPatient, isNotNull(lesions.trackId))}`,
        ),
        biopsies: rowsOf<[string | null, Histology]>(
          [biopsies.lesionId, biopsies.histology],
          dsql`from ${biopsies} inner join ${visits} on ${eq(visits.id, biopsies.visitId)} where ${and(ofPatient, isNotNull(biopsies.histology))}`,
        ),
        // One row per lesion a treatment treated: the list stored with it and the named lesion (a row
        // written without the list, by a bulk load, still treats the lesion it names).
        treatments: rowsOf<[string | null, string]>(
          [dsql`treated.lesion_id`, treatments.visitId],
          dsql`from ${treatments} inner join ${visits} on ${eq(visits.id, treatments.visitId)} cross join lateral unnest(array_append(${treatments.treatedLesionIds}, ${treatments.lesionId})) as treated(lesion_id) where ${ofPatient}`,
        ),
        checks: rowsOf<[string, string, (typeof trackChecks.$inferSelect)["outcome"]]>(
          [trackChecks.visitId, trackChecks.trackId, trackChecks.outcome],
          dsql`from ${trackChecks} inner join ${visits} on ${eq(visits.id, trackChecks.visitId)} where ${ofPatient}`,
        ),
        statuses: rowsOf<[string, string, string, StoredStatus["status"], StoredStatus["effectiveGrade"], StoredStatus["reason"]]>(
          [trackStatuses.trackId, trackStatuses.visitId, trackStatuses.siteId, trackStatuses.status, trackStatuses.effectiveGrade, trackStatuses.reason],
          dsql`from ${trackStatuses} inner join ${lesionTracks} on ${eq(lesionTracks.id, trackStatuses.trackId)} where ${eq(lesionTracks.patientId, patientParam)}`,
        ),
      })
      .from(dsql`(select) as one`),
);

export type StoredStatus = Pick<typeof trackStatuses.$inferSelect, "trackId" | "visitId" | "siteId" | "status" | "effectiveGrade" | "reason">;

export type TrackHistoryRead = HistoryRows & { statuses: StoredStatus[] };

/** A patient's track history (the rows lib/tracking reads) and the statuses stored now. */
export async function readTrackHistory(run: Runner, patientId: string): Promise<TrackHistoryRead> {
  const [h] = await historyOfPatient(run, { patientId });
  return {
    visits: h!.visits.map(([id, visitDate, status]) => ({ id, visitDate, status })),
    tracks: h!.tracks.map(([id, label]) => ({ id, label })),
    lesions: h!.lesions.map(([id, visitId, trackId, grade]) => ({ id, visitId, trackId, grade })),
    biopsies: h!.biopsies.map(([lesionId, histology]) => ({ lesionId, histology })),
    treatments: h!.treatments.map(([lesionId, visitId]) => ({ lesionId, visitId })),
    checks: h!.checks.map(([visitId, trackId, outcome]) => ({ visitId, trackId, outcome })),
    statuses: h!.statuses.map(([trackId, visitId, siteId, status, effectiveGrade, reason]) => ({ trackId, visitId, siteId, status, effectiveGrade, reason })),
  };
}

// Status rows written, however many, as one statement built once: each column is one array
// parameter, turned back into rows by unnest (in the table's column order).
const ph = (name: string) => dsql.placeholder(name);
const upsertStatuses = prepared((run) =>
  run
    .insert(trackStatuses)
    .select(
      dsql`select * from unnest(${ph("trackIds")}::uuid[], ${ph("visitIds")}::uuid[], ${ph("siteIds")}::uuid[], ${ph("statuses")}::track_status[], ${ph("grades")}::grade[], ${ph("reasons")}::text[])`,
    )
    .onConflictDoUpdate({
      target: [trackStatuses.trackId, trackStatuses.visitId],
      set: { siteId: dsql`excluded.site_id`, status: dsql`excluded.status`, effectiveGrade: dsql`excluded.effective_grade`, reason: dsql`excluded.reason` },
    }),
);

export function writeTrackStatuses(run: Runner, rows: StoredStatus[]) {
  return upsertStatuses(run, {
    trackIds: pgArrayLiteral(rows.map((r) => r.trackId)),
    visitIds: pgArrayLiteral(rows.map((r) => r.visitId)),
    siteIds: pgArrayLiteral(rows.map((r) => r.siteId)),
    statuses: pgArrayLiteral(rows.map((r) => r.status)),
    grades: pgArrayLiteral(rows.map((r) => r.effectiveGrade ?? null)),
    reasons: pgArrayLiteral(rows.map((r) => r.reason)),
  });
}

export function deleteTrackStatuses(run: Runner, trackId: string, visitIds: string[]) {
  return run.delete(trackStatuses).where(and(eq(trackStatuses.trackId, trackId), inArray(trackStatuses.visitId, visitIds))).execute();
}
