import "server-only";
import { and, eq, isNotNull, sql as dsql } from "drizzle-orm";
import { db, prepared } from "../client";
import { adjudications, biopsies, lesions, lesionTracks, patients, reviews, trackChecks, trackStatuses, treatments, users, visits } from "../schema";
import { inScopeParam, siteIdsParam, type SiteScope } from "./scope";
import { rowsOf } from "./json-rows";
import { auditOfRead, auditValues, type ReadAudit } from "./audit-write";
import { AppError } from "@/lib/errors";
import type { TimelineRows } from "@/lib/timeline/assemble";

type Visit = typeof visits.$inferSelect;
type Biopsy = typeof biopsies.$inferSelect;
type Treatment = typeof treatments.$inferSelect;
type Review = typeof reviews.$inferSelect;
type Adjudication = typeof adjudications.$inferSelect;

const ofPatient = eq(visits.patientId, patients.id);

const patientInScope = and(eq(patients.id, dsql.placeholder("patientId")), inScopeParam(patients.siteId));

// The patient in the caller's scope and the short lists the timeline shows of them, in one
// statement built once: each list is a JSON array (json-rows.ts), read only when the patient row
// is in scope. The same statement writes the read's audit row (auditOfRead).
const timelineOf = prepared((run) =>
  run
    .with(auditOfRead(run, { siteId: dsql`${patients.siteId}`, patientId: dsql`${patients.id}`, entityId: dsql`null` }, dsql`from ${patients} where ${patientInScope}`))
    .select({
      id: patients.id,
      siteId: patients.siteId,
      familyName: patients.familyName,
      givenName: patients.givenName,
      mrn: patients.mrn,
      visits: rowsOf<[string, Visit["visitDate"], Visit["status"], Visit["patientPosition"], string, string]>(
        [visits.id, visits.visitDate, visits.status, visits.patientPosition, users.displayName, visits.examinerId],
        dsql`from ${visits} inner join ${users} on ${eq(users.id, visits.examinerId)} where ${ofPatient}`,
        dsql`${visits.visitDate}, ${visits.createdAt}`,
      ),
      tracks: rowsOf<[string, string]>([lesionTracks.id, lesionTracks.label], dsql`from ${lesionTracks} where ${eq(lesionTracks.patientId, patients.id)}`, dsql`${lesionTracks.createdAt}`),
      biopsies: rowsOf<[string | null, string, Biopsy["histology"]]>(
        [biopsies.lesionId, biopsies.specimenLabel, biopsies.histology],
        dsql`from ${biopsies} inner join ${visits} on ${eq(visits.id, biopsies.visitId)} where ${and(ofPatient, isNotNull(biopsies.lesionId))}`,
      ),
      treatments: rowsOf<[string, string | null, Treatment["arcs"], Treatment["modality"]]>(
        [treatments.visitId, treatments.lesionId, treatments.arcs, treatments.modality],
        dsql`from ${treatments} inner join ${visits} on ${eq(visits.id, treatments.visitId)} where ${ofPatient}`,
      ),
      checks: rowsOf<[string, string, (typeof trackChecks.$inferSelect)["outcome"]]>(
        [trackChecks.visitId, trackChecks.trackId, trackChecks.outcome],
        dsql`from ${trackChecks} inner join ${lesionTracks} on ${eq(lesionTracks.id, trackChecks.trackId)} where ${eq(lesionTracks.patientId, patients.id)}`,
      ),
      reviews: rowsOf<[string, string, string | null, Review["status"], string | null]>(
        [reviews.id, reviews.visitId, reviews.comparedVisitId, reviews.status, reviews.reviewerId],
        dsql`from ${reviews} where ${eq(reviews.patientId, patients.id)}`,
      ),
      adjudications: rowsOf<[string, string, string, Adjudication["verdict"], Adjudication["proposedStatus"], string | null, string | null, string]>(
        [adjudications.id, adjudications.reviewId, adjudications.trackId, adjudications.verdict, adjudications.proposedStatus, adjudications.comment, adjudications.resolvedAt, adjudications.createdAt],
        dsql`from ${adjudications} inner join ${reviews} on ${eq(reviews.id, adjudications.reviewId)} where ${eq(reviews.patientId, patients.id)}`,
      ),
    })
    .from(patients)
    .where(patientInScope),
);

// The two long lists (a lesion per visit and track, a status per visit and track: 1,200 each for
// 30 visits × 40 tracks) as plain rows, each its own statement built once: built as JSON in the
// statement above they cost PostgreSQL about three times as much, and the server more to parse
// (npm run bench, timeline GET). Each is filtered by the same patient-in-scope condition.
const patientOfVisitInScope = and(eq(patients.id, visits.patientId), patientInScope);
const lesionsOf = prepared((run) =>
  run
    .select({
      id: lesions.id, visitId: lesions.visitId, trackId: lesions.trackId, label: lesions.label, clockStartH: lesions.clockStartH, clockEndH: lesions.clockEndH,
      distanceStartCm: lesions.distanceStartCm, distanceEndCm: lesions.distanceEndCm, zone: lesions.zone, grade: lesions.grade, version: lesions.version,
    })
    .from(lesions)
    .innerJoin(visits, eq(visits.id, lesions.visitId))
    .innerJoin(patients, patientOfVisitInScope),
);
const statusesOf = prepared((run) =>
  run
    .select({ trackId: trackStatuses.trackId, visitId: trackStatuses.visitId, status: trackStatuses.status, effectiveGrade: trackStatuses.effectiveGrade, reason: trackStatuses.reason })
    .from(trackStatuses)
    .innerJoin(lesionTracks, eq(lesionTracks.id, trackStatuses.trackId))
    .innerJoin(patients, and(eq(patients.id, lesionTracks.patientId), patientInScope)),
);

/**
 * Everything the timeline and compare screens need for one patient, in three statements whatever
 * the number of visits and lesions, sent at once on the pool: the patient and the short lists
 * (read only when the patient is in scope), the lesions and the statuses. The first records the
 * read (`audit`, completed with the patient's site and id) when the patient is in scope. (Read in
 * one REPEATABLE READ transaction instead, to share one snapshot, the three took longer than the
 * one JSON statement they replace.) Each starts its own snapshot, microseconds apart, so a lesion
 * or status of a visit or track the first statement did not see (made in between) is left out:
 * every row the timeline answers belongs to a visit and track it lists.
 */
export async function readTimelineRows(scope: SiteScope, patientId: string, audit: ReadAudit): Promise<TimelineRows> {
  const siteIds = siteIdsParam(scope);
  const [[patient], allLesions, allStatuses] = await Promise.all([
    timelineOf(db, { patientId, siteIds, ...auditValues(audit) }),
    lesionsOf(db, { patientId, siteIds }),
    statusesOf(db, { patientId, siteIds }),
  ]);
  if (!patient) throw new AppError("not_found");

  const visitRows = patient.visits.map(([id, visitDate, status, patientPosition, examiner, examinerId]) => ({ id, visitDate, status, patientPosition, examiner, examinerId }));
  const trackRows = patient.tracks.map(([id, label]) => ({ id, label }));
  const visitIds = new Set(visitRows.map((v) => v.id));
  const trackIds = new Set(trackRows.map((t) => t.id));
  const lesionRows = allLesions.filter((l) => visitIds.has(l.visitId) && (l.trackId === null || trackIds.has(l.trackId)));
  const statusRows = allStatuses.filter((r) => visitIds.has(r.visitId) && trackIds.has(r.trackId));
  const biopsyRows = patient.biopsies.map(([lesionId, label, histology]) => ({ lesionId, label, histology }));
  const treatmentRows = patient.treatments.map(([visitId, lesionId, arcs, modality]) => ({ visitId, lesionId, arcs, modality }));
  const checkRows = patient.checks.map(([visitId, trackId, outcome]) => ({ visitId, trackId, outcome }));
  const reviewRows = patient.reviews.map(([id, visitId, comparedVisitId, status, reviewerId]) => ({ id, visitId, comparedVisitId, status, reviewerId }));
  const adjudicationRows = patient.adjudications.map(([id, reviewId, trackId, verdict, proposedStatus, comment, resolvedAt, createdAt]) => ({
    id, reviewId, trackId, verdict, proposedStatus, comment, resolvedAt: resolvedAt === null ? null : new Date(resolvedAt), createdAt: new Date(createdAt),
  }));

  return {
    patient: { id: patient.id, siteId: patient.siteId, familyName: patient.familyName, givenName: patient.givenName, mrn: patient.mrn },
    visits: visitRows, tracks: trackRows, lesions: lesionRows, biopsies: biopsyRows, treatments: treatmentRows,
    statuses: statusRows, checks: checkRows, reviews: reviewRows, adjudications: adjudicationRows,
  };
}
