import "server-only";
import { and, asc, eq, isNotNull } from "drizzle-orm";
import { db } from "../client";
import { adjudications, biopsies, lesions, lesionTracks, patients, reviews, trackChecks, trackStatuses, treatments, users, visits } from "../schema";
import { inScope, type SiteScope } from "./scope";
import { recordAudit, type AuditInput } from "./audit";
import { AppError } from "@/lib/errors";
import { HISTOLOGY, HISTOLOGY_AS_GRADE, type Grade, type Histology } from "@/lib/domain/vocab";
import { unionLengthH } from "@/lib/geometry/arcs";

/**
 * Everything the timeline and compare screens need for one patient, in a fixed number of
 * queries (ten) whatever the number of visits and lesions: the patient in scope, then the rest
 * together. The read is audited (`audit`, completed with the patient) in that same second batch.
 */
export async function loadTimeline(scope: SiteScope, patientId: string, audit?: Omit<AuditInput, "siteId" | "patientId">) {
  const [patient] = await db
    .select({ id: patients.id, siteId: patients.siteId, familyName: patients.familyName, givenName: patients.givenName, mrn: patients.mrn })
    .from(patients)
    .where(and(eq(patients.id, patientId), inScope(patients.siteId, scope)));
  if (!patient) throw new AppError("not_found");

  const [visitRows, trackRows, lesionRows, biopsyRows, treatmentRows, statusRows, checkRows, reviewRows, adjudicationRows] = await Promise.all([
    db.select({ id: visits.id, visitDate: visits.visitDate, status: visits.status, patientPosition: visits.patientPosition, examiner: users.displayName, examinerId: visits.examinerId })
      .from(visits).innerJoin(users, eq(users.id, visits.examinerId)).where(eq(visits.patientId, patient.id)).orderBy(asc(visits.visitDate), asc(visits.createdAt)),
    db.select({ id: lesionTracks.id, label: lesionTracks.label }).from(lesionTracks).where(eq(lesionTracks.patientId, patient.id)).orderBy(asc(lesionTracks.createdAt)),
    db.select({
      id: lesions.id, visitId: lesions.visitId, trackId: lesions.trackId, label: lesions.label, clockStartH: lesions.clockStartH, clockEndH: lesions.clockEndH,
      distanceStartCm: lesions.distanceStartCm, distanceEndCm: lesions.distanceEndCm, zone: lesions.zone, grade: lesions.grade, version: lesions.version,
    }).from(lesions).innerJoin(visits, eq(visits.id, lesions.visitId)).where(eq(visits.patientId, patient.id)),
    db.select({ lesionId: biopsies.lesionId, label: biopsies.specimenLabel, histology: biopsies.histology })
      .from(biopsies).innerJoin(visits, eq(visits.id, biopsies.visitId)).where(and(eq(visits.patientId, patient.id), isNotNull(biopsies.lesionId))),
    db.select({ visitId: treatments.visitId, lesionId: treatments.lesionId, arcs: treatments.arcs, modality: treatments.modality })
      .from(treatments).innerJoin(visits, eq(visits.id, treatments.visitId)).where(eq(visits.patientId, patient.id)),
    db.select({ trackId: trackStatuses.trackId, visitId: trackStatuses.visitId, status: trackStatuses.status, effectiveGrade: trackStatuses.effectiveGrade, reason: trackStatuses.reason })
      .from(trackStatuses).innerJoin(lesionTracks, eq(lesionTracks.id, trackStatuses.trackId)).where(eq(lesionTracks.patientId, patient.id)),
    db.select({ visitId: trackChecks.visitId, trackId: trackChecks.trackId, outcome: trackChecks.outcome })
      .from(trackChecks).innerJoin(lesionTracks, eq(lesionTracks.id, trackChecks.trackId)).where(eq(lesionTracks.patientId, patient.id)),
    db.select({ id: reviews.id, visitId: reviews.visitId, comparedVisitId: reviews.comparedVisitId, status: reviews.status, reviewerId: reviews.reviewerId })
      .from(reviews).where(eq(reviews.patientId, patient.id)),
    db.select({ id: adjudications.id, reviewId: adjudications.reviewId, trackId: adjudications.trackId, verdict: adjudications.verdict, proposedStatus: adjudications.proposedStatus, comment: adjudications.comment, resolvedAt: adjudications.resolvedAt, createdAt: adjudications.createdAt })
      .from(adjudications).innerJoin(reviews, eq(reviews.id, adjudications.reviewId)).where(eq(reviews.patientId, patient.id)),
    audit ? recordAudit({ ...audit, siteId: patient.siteId, patientId: patient.id }) : null,
  ]);

  const histologyByLesion = new Map<string, Histology>();
  const biopsyLabels = new Map<string, string[]>();
  for (const b of biopsyRows) {
    if (!b.lesionId) continue;
    biopsyLabels.set(b.lesionId, [...(biopsyLabels.get(b.lesionId) ?? []), b.label]);
    const prev = histologyByLesion.get(b.lesionId);
    if (b.histology && (!prev || HISTOLOGY.indexOf(b.histology) > HISTOLOGY.indexOf(prev))) histologyByLesion.set(b.lesionId, b.histology);
  }
  const treatedLesions = new Set(treatmentRows.map((t) => t.lesionId).filter(Boolean));
  const lesionDtos = lesionRows.map((l) => {
    const histology = histologyByLesion.get(l.id) ?? null;
    const effectiveGrade: Grade = histology ? HISTOLOGY_AS_GRADE[histology] : l.grade;
    return { ...l, histology, effectiveGrade, biopsyLabels: biopsyLabels.get(l.id) ?? [], treated: treatedLesions.has(l.id) };
  });

  const perVisit = visitRows.map((v) => {
    const mine = lesionDtos.filter((l) => l.visitId === v.id);
    const counts: Record<string, number> = {};
    for (const l of mine) counts[l.effectiveGrade] = (counts[l.effectiveGrade] ?? 0) + 1;
    const arcs = treatmentRows.filter((t) => t.visitId === v.id).flatMap((t) => t.arcs);
    return { visitId: v.id, visitDate: v.visitDate, countsByGrade: counts, lesionCount: mine.length, treatedFraction: arcs.length ? unionLengthH(arcs) / 12 : 0 };
  });

  return {
    patient: { id: patient.id, siteId: patient.siteId, name: `${patient.familyName}, ${patient.givenName}`, mrn: patient.mrn },
    visits: visitRows,
    tracks: trackRows,
    lesions: lesionDtos,
    statuses: statusRows,
    checks: checkRows,
    perVisit,
    reviews: reviewRows.map((r) => ({ ...r, adjudications: adjudicationRows.filter((a) => a.reviewId === r.id) })),
  };
}

export type TimelineDto = Awaited<ReturnType<typeof loadTimeline>>;
