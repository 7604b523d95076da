import "server-only";
import { and, asc, eq } from "drizzle-orm";
import { alias } from "drizzle-orm/pg-core";
import { db } from "../client";
import {
  addenda, anaestheticDoses, biopsies, complications, lesionTracks, lesions, patients, sites, trackStatuses, treatments, users,
  visitDiagnoses, visits,
} from "../schema";
import { inScope, type SiteScope } from "./scope";
import { AppError } from "@/lib/errors";
import type { VisitReportData } from "@/lib/report/types";

const examiner = alias(users, "examiner");
const signer = alias(users, "signer");

/**
 * Everything the visit report prints, in eight queries whatever the number of lesions,
 * biopsies or treatments: the header first (so another site's visit is a 404 before any
 * other read), then seven lists in parallel, each scoped to the caller's sites.
 */
export async function loadVisitReport(scope: SiteScope, visitId: string): Promise<VisitReportData> {
  const [head] = await db
    .select({
      visitId: visits.id, siteId: visits.siteId, patientId: visits.patientId, visitDate: visits.visitDate, status: visits.status,
      patientPosition: visits.patientPosition, indication: visits.indication, cytology: visits.cytology, hpvResult: visits.hpvResult,
      adequacy: visits.adequacy, examStartedAt: visits.examStartedAt, examEndedAt: visits.examEndedAt, anaesthesia: visits.anaesthesia,
      patientWeightKg: visits.patientWeightKg, plan: visits.plan, signedAt: visits.signedAt,
      examinerName: examiner.displayName, signerName: signer.displayName, siteName: sites.name,
      mrn: patients.mrn, familyName: patients.familyName, givenName: patients.givenName, dateOfBirth: patients.dateOfBirth,
      sexAtBirth: patients.sexAtBirth,
    })
    .from(visits)
    .innerJoin(patients, eq(patients.id, visits.patientId))
    .innerJoin(sites, eq(sites.id, visits.siteId))
    .innerJoin(examiner, eq(examiner.id, visits.examinerId))
    .leftJoin(signer, eq(signer.id, visits.signedBy))
    .where(and(eq(visits.id, visitId), inScope(visits.siteId, scope)))
    .limit(1);
  if (!head) throw new AppError("not_found");

  const author = alias(users, "author");
  const overrider = alias(users, "overrider");
  const [lesionRows, biopsyRows, treatmentRows, doseRows, complicationRows, addendumRows, diagnosisRows] = await Promise.all([
    db
      .select({
        id: lesions.id, label: lesions.label, trackLabel: lesionTracks.label, clockStartH: lesions.clockStartH, clockEndH: lesions.clockEndH,
        distanceStartCm: lesions.distanceStartCm, distanceEndCm: lesions.distanceEndCm, zone: lesions.zone, grade: lesions.grade,
        morphology: lesions.morphology, acetowhite: lesions.acetowhite, lugol: lesions.lugol, vessels: lesions.vessels, sizeMm: lesions.sizeMm,
        note: lesions.note, trackStatus: trackStatuses.status, effectiveGrade: trackStatuses.effectiveGrade,
      })
      .from(lesions)
      .leftJoin(lesionTracks, eq(lesionTracks.id, lesions.trackId))
      .leftJoin(trackStatuses, and(eq(trackStatuses.trackId, lesions.trackId), eq(trackStatuses.visitId, lesions.visitId)))
      .where(and(eq(lesions.visitId, visitId), inScope(lesions.siteId, scope)))
      .orderBy(asc(lesions.label)),
    db
      .select({
        id: biopsies.id, lesionId: biopsies.lesionId, specimenLabel: biopsies.specimenLabel, clockH: biopsies.clockH, distanceCm: biopsies.distanceCm,
        histology: biopsies.histology, ainGrade: biopsies.ainGrade, p16: biopsies.p16, resultEnteredAt: biopsies.resultEnteredAt,
      })
      .from(biopsies)
      .where(and(eq(biopsies.visitId, visitId), inScope(biopsies.siteId, scope)))
      .orderBy(asc(biopsies.specimenLabel)),
    db
      .select({
        id: treatments.id, lesionId: treatments.lesionId, modality: treatments.modality, regimen: treatments.regimen, arcs: treatments.arcs,
        treatedFraction: treatments.treatedFraction, extentOverrideReason: treatments.extentOverrideReason, note: treatments.note,
      })
      .from(treatments)
      .where(and(eq(treatments.visitId, visitId), inScope(treatments.siteId, scope)))
      .orderBy(asc(treatments.createdAt), asc(treatments.id)),
    db
      .select({
        id: anaestheticDoses.id, agent: anaestheticDoses.agent, concentrationPct: anaestheticDoses.concentrationPct, volumeMl: anaestheticDoses.volumeMl,
        withEpinephrine: anaestheticDoses.withEpinephrine, doseMg: anaestheticDoses.doseMg, overrideReason: anaestheticDoses.overrideReason,
        overriddenByName: overrider.displayName,
      })
      .from(anaestheticDoses)
      .leftJoin(overrider, eq(overrider.id, anaestheticDoses.overriddenBy))
      .where(and(eq(anaestheticDoses.visitId, visitId), inScope(anaestheticDoses.siteId, scope)))
      .orderBy(asc(anaestheticDoses.createdAt), asc(anaestheticDoses.id)),
    db
      .select({ kind: complications.kind, severity: complications.severity, afterProcedure: complications.afterProcedure, note: complications.note })
      .from(complications)
      .where(and(eq(complications.visitId, visitId), inScope(complications.siteId, scope)))
      .orderBy(asc(complications.id)),
    db
      .select({ body: addenda.body, createdAt: addenda.createdAt, authorName: author.displayName })
      .from(addenda)
      .innerJoin(author, eq(author.id, addenda.authorId))
      .where(and(eq(addenda.visitId, visitId), inScope(addenda.siteId, scope)))
      .orderBy(asc(addenda.createdAt), asc(addenda.id)),
    db
      .select({ code: visitDiagnoses.code, descriptor: visitDiagnoses.descriptor })
      .from(visitDiagnoses)
      .where(and(eq(visitDiagnoses.visitId, visitId), inScope(visitDiagnoses.siteId, scope)))
      .orderBy(asc(visitDiagnoses.code)),
  ]);

  const { siteId, patientId, mrn, familyName, givenName, dateOfBirth, sexAtBirth, siteName, ...visit } = head;
  return {
    siteId,
    patientId,
    siteName,
    patient: { mrn, familyName, givenName, dateOfBirth, sexAtBirth },
    visit: {
      ...visit,
      examStartedAt: visit.examStartedAt?.toISOString() ?? null,
      examEndedAt: visit.examEndedAt?.toISOString() ?? null,
      signedAt: visit.signedAt?.toISOString() ?? null,
    },
    lesions: lesionRows,
    biopsies: biopsyRows.map((b) => ({ ...b, resultEnteredAt: b.resultEnteredAt?.toISOString() ?? null })),
    treatments: treatmentRows,
    doses: doseRows,
    complications: complicationRows,
    addenda: addendumRows.map((a) => ({ ...a, createdAt: a.createdAt.toISOString() })),
    diagnoses: diagnosisRows,
  };
}
