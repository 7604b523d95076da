import "server-only";
// Statements of track statuses: a patient's track history as rows, and the stored statuses
// written or removed. What the statuses are is decided in lib/tracking, by lib/server/track-statuses.ts.
import { and, eq, inArray, isNotNull, sql as dsql, type SQL } from "drizzle-orm";
import { biopsies, lesions, trackChecks, trackStatuses, trackSummaries, treatments, visits, lesionTracks } from "../schema";
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
// The tracks read: all of the patient's, or only those in the `trackIds` parameter. Two statements
// rather than one with "parameter is null or …", so each gets a plan that uses the track indexes.
const tracksParam = dsql`${dsql.placeholder("trackIds")}::uuid[]`;
type Filter = (column: SQL) => SQL;
const allTracks: Filter = () => dsql`true`;
const someTracks: Filter = (trackColumn) => dsql`${trackColumn} = any(${tracksParam})`;
const lesionOf = (filter: Filter): Filter => (filter === allTracks ? allTracks : (lesionColumn) => dsql`${lesionColumn} in (select ${lesions.id} from ${lesions} where ${lesions.trackId} = any(${tracksParam}))`);

// A patient's track history (all tracks, or only some), the stored statuses of those tracks and the
// stored summary of every track, in one statement built once (every lesion write runs it): each
// part is a JSON array of rows, so the driver parses one value per part. The summaries are looked
// up track by track (a correlated subquery on the primary key), whatever the table's size.
const historyStatement = (ofTracks: Filter) => {
  const lesionOfTracks = lesionOf(ofTracks);
  return prepared((run) =>
    run
      .select({
        visits: rowsOf<[string, Visit["visitDate"], Visit["status"]]>([visits.id, visits.visitDate, visits.status], dsql`from ${visits} where ${ofPatient}`, dsql`${visits.visitDate}, ${visits.createdAt}`),
        tracks: rowsOf<[string, string]>([lesionTracks.id, lesionTracks.label], dsql`from ${lesionTracks} where ${and(eq(lesionTracks.patientId, patientParam), ofTracks(dsql`${lesionTracks.id}`))}`),
        lesions: rowsOf<[string, string, string, Lesion["grade"]]>(
          [lesions.id, lesions.visitId, lesions.trackId, lesions.grade],
          dsql`from ${lesions} inner join ${visits} on ${eq(visits.id, lesions.visitId)} where ${and(ofPatient, isNotNull(lesions.trackId), ofTracks(dsql`${lesions.trackId}`))}`,
        ),
        biopsies: rowsOf<[string | null, Histology]>(
          [biopsies.lesionId, biopsies.histology],
          dsql`from ${biopsies} inner join ${visits} on ${eq(visits.id, biopsies.visitId)} where ${and(ofPatient, isNotNull(biopsies.histology), lesionOfTracks(dsql`${biopsies.lesionId}`))}`,
        ),
        // One row per lesion a treatment treated: the list stored with it and the named lesion (a row
        // written without the list, by a bulk load, still treats the lesion it names).
        treatments: rowsOf<[string | null, string]>(
          [dsql`treated.lesion_id`, treatments.visitId],
          dsql`from ${treatments} inner join ${visits} on ${eq(visits.id, treatments.visitId)} cross join lateral unnest(array_append(${treatments.treatedLesionIds}, ${treatments.lesionId})) as treated(lesion_id) where ${and(ofPatient, lesionOfTracks(dsql`treated.lesion_id`))}`,
        ),
        checks: rowsOf<[string, string, (typeof trackChecks.$inferSelect)["outcome"]]>(
          [trackChecks.visitId, trackChecks.trackId, trackChecks.outcome],
          dsql`from ${trackChecks} inner join ${visits} on ${eq(visits.id, trackChecks.visitId)} where ${and(ofPatient, ofTracks(dsql`${trackChecks.trackId}`))}`,
        ),
        statuses: rowsOf<[string, string, string, StoredStatus["status"], StoredStatus["effectiveGrade"], StoredStatus["reason"]]>(
          [trackStatuses.trackId, trackStatuses.visitId, trackStatuses.siteId, trackStatuses.status, trackStatuses.effectiveGrade, trackStatuses.reason],
          dsql`from ${trackStatuses} inner join ${lesionTracks} on ${eq(lesionTracks.id, trackStatuses.trackId)} where ${and(eq(lesionTracks.patientId, patientParam), ofTracks(dsql`${trackStatuses.trackId}`))}`,
        ),
        summaries: rowsOf<[string, [string | null, string | null, boolean] | null]>(
          [
            lesionTracks.id,
            dsql`(select json_build_array(${trackSummaries.firstSeen}, ${trackSummaries.firstDiseased}, ${trackSummaries.earlierDiseaseElsewhere}) from ${trackSummaries} where ${eq(trackSummaries.trackId, lesionTracks.id)})`,
          ],
          dsql`from ${lesionTracks} where ${eq(lesionTracks.patientId, patientParam)}`,
        ),
      })
      .from(dsql`(select) as one`),
  );
};
const historyOfPatient = historyStatement(allTracks);
const historyOfTracks = historyStatement(someTracks);

export type StoredStatus = Pick<typeof trackStatuses.$inferSelect, "trackId" | "visitId" | "siteId" | "status" | "effectiveGrade" | "reason">;

/** What is stored of a track's summary; null when the track has none yet. */
export interface StoredSummary {
  trackId: string;
  stored: { firstSeen: string | null; firstDiseased: string | null; earlierDiseaseElsewhere: boolean } | null;
}

export type TrackHistoryRead = HistoryRows & { statuses: StoredStatus[]; summaries: StoredSummary[] };

/**
 * A patient's track history (the rows lib/tracking reads) and the statuses stored now, of every
 * track or only of `trackIds`; and every track's stored summary.
 */
export async function readTrackHistory(run: Runner, patientId: string, trackIds: readonly string[] | null = null): Promise<TrackHistoryRead> {
  const [h] = await (trackIds ? historyOfTracks(run, { patientId, trackIds: pgArrayLiteral(trackIds) }) : historyOfPatient(run, { patientId }));
  return {
    visits: h!.visits.map(([id, visitDate, status]) => ({ id, visitDate, status })),
    tracks: h!.tracks.map(([id, label]) => ({ id, label })),
    lesions: h!.lesions.map(([id, visitId, trackId, grade]) => ({ id, visitId, trackId, grade })),
    biopsies: h!.biopsies.map(([lesionId, histology]) => ({ lesionId, histology })),
    treatments: h!.treatments.map(([lesionId, visitId]) => ({ lesionId, visitId })),
    checks: h!.checks.map(([visitId, trackId, outcome]) => ({ visitId, trackId, outcome })),
    statuses: h!.statuses.map(([trackId, visitId, siteId, status, effectiveGrade, reason]) => ({ trackId, visitId, siteId, status, effectiveGrade, reason })),
    summaries: h!.summaries.map(([trackId, stored]) => ({
      trackId,
      stored: stored ? { firstSeen: stored[0], firstDiseased: stored[1], earlierDiseaseElsewhere: stored[2] } : null,
    })),
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

export interface TrackSummaryRow {
  trackId: string;
  siteId: string;
  firstSeen: string | null;
  firstDiseased: string | null;
  earlierDiseaseElsewhere: boolean;
}

// Track summaries written, however many, as one statement built once (as upsertStatuses).
const upsertSummaries = prepared((run) =>
  run
    .insert(trackSummaries)
    .select(dsql`select * from unnest(${ph("trackIds")}::uuid[], ${ph("siteIds")}::uuid[], ${ph("firstSeen")}::date[], ${ph("firstDiseased")}::date[], ${ph("flags")}::boolean[])`)
    .onConflictDoUpdate({
      target: trackSummaries.trackId,
      set: { siteId: dsql`excluded.site_id`, firstSeen: dsql`excluded.first_seen`, firstDiseased: dsql`excluded.first_diseased`, earlierDiseaseElsewhere: dsql`excluded.earlier_disease_elsewhere` },
    }),
);

export function writeTrackSummaries(run: Runner, rows: TrackSummaryRow[]) {
  return upsertSummaries(run, {
    trackIds: pgArrayLiteral(rows.map((r) => r.trackId)),
    siteIds: pgArrayLiteral(rows.map((r) => r.siteId)),
    firstSeen: pgArrayLiteral(rows.map((r) => r.firstSeen)),
    firstDiseased: pgArrayLiteral(rows.map((r) => r.firstDiseased)),
    flags: pgArrayLiteral(rows.map((r) => String(r.earlierDiseaseElsewhere))),
  });
}
