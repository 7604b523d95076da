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
type Lesion = typeof lesions.$inferSelect;
type Biopsy = typeof biopsies.$inferSelect;
type Treatment = typeof treatments.$inferSelect;
type TrackStatus = typeof trackStatuses.$inferSelect;
type Review = typeof reviews.$inferSelect;
type Adjudication = typeof adjudications.$inferSelect;

const ofPatient = eq(visits.patientId, patients.id);

const patientInScope = and(eq(patients.id, dsql.placeholder("patientId")), inScopeParam(patients.siteId));

// The patient in the caller's scope and everything the timeline shows of them, in one statement
// built once: each list is a JSON array (json-rows.ts), read only when the patient row is in scope.
// The same statement writes the read's audit row (auditOfRead).
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
      lesions: rowsOf<[string, string, string | null, string, number, number, number, number, Lesion["zone"], Lesion["grade"], number]>(
        [lesions.id, lesions.visitId, lesions.trackId, lesions.label, lesions.clockStartH, lesions.clockEndH, lesions.distanceStartCm, lesions.distanceEndCm, lesions.zone, lesions.grade, lesions.version],
        dsql`from ${lesions} inner join ${visits} on ${eq(visits.id, lesions.visitId)} where ${ofPatient}`,
      ),
      biopsies: rowsOf<[string | null, string, Biopsy["histology"]]>(
        [biopsies.lesionId, biopsies.specimenLabel, biopsies.histology],
        dsql`from ${biopsies} inner join ${visits} on ${eq(visits.id, biopsies.visitId)} where ${and(ofPatient, isNotNull(biopsies.lesionId))}`,
      ),
      treatments: rowsOf<[string, string | null, Treatment["arcs"], Treatment["modality"]]>(
        [treatments.visitId, treatments.lesionId, treatments.arcs, treatments.modality],
        dsql`from ${treatments} inner join ${visits} on ${eq(visits.id, treatments.visitId)} where ${ofPatient}`,
      ),
      statuses: rowsOf<[string, string, TrackStatus["status"], TrackStatus["effectiveGrade"], TrackStatus["reason"]]>(
        [trackStatuses.trackId, trackStatuses.visitId, trackStatuses.status, trackStatuses.effectiveGrade, trackStatuses.reason],
        dsql`from ${trackStatuses} inner join ${lesionTracks} on ${eq(lesionTracks.id, trackStatuses.trackId)} where ${eq(lesionTracks.patientId, patients.id)}`,
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

/**
 * Everything the timeline and compare screens need for one patient, in one statement whatever the
 * number of visits and lesions (the patient in scope, and the lists only if it is). The same
 * statement records the read (`audit`, completed with the patient's site and id) when the patient
 * is in scope.
 */
export async function readTimelineRows(scope: SiteScope, patientId: string, audit: ReadAudit): Promise<TimelineRows> {
  const [patient] = await timelineOf(db, { patientId, siteIds: siteIdsParam(scope), ...auditValues(audit) });
  if (!patient) throw new AppError("not_found");

  const visitRows = patient.visits.map(([id, visitDate, status, patientPosition, examiner, examinerId]) => ({ id, visitDate, status, patientPosition, examiner, examinerId }));
  const trackRows = patient.tracks.map(([id, label]) => ({ id, label }));
  const lesionRows = patient.lesions.map(([id, visitId, trackId, label, clockStartH, clockEndH, distanceStartCm, distanceEndCm, zone, grade, version]) => ({
    id, visitId, trackId, label, clockStartH, clockEndH, distanceStartCm, distanceEndCm, zone, grade, version,
  }));
  const biopsyRows = patient.biopsies.map(([lesionId, label, histology]) => ({ lesionId, label, histology }));
  const treatmentRows = patient.treatments.map(([visitId, lesionId, arcs, modality]) => ({ visitId, lesionId, arcs, modality }));
  const statusRows = patient.statuses.map(([trackId, visitId, status, effectiveGrade, reason]) => ({ trackId, visitId, status, effectiveGrade, reason }));
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
