import "server-only";
import { and, asc, eq, isNull } from "drizzle-orm";
import { db } from "../client";
import { biopsies, lesions, patients, users, visits } from "../schema";
import { inScope, type SiteScope } from "./scope";
import { loadVisit, lockDraftVisit } from "./visit-access";
import { refreshTrackStatuses } from "./tracking";
import { recordAudit } from "./audit-write";
import { AppError } from "@/lib/errors";
import type { CreateBiopsyInput, HistologyResultInput } from "@/lib/validation/biopsies";

const columns = {
  id: biopsies.id,
  visitId: biopsies.visitId,
  lesionId: biopsies.lesionId,
  lesionLabel: lesions.label,
  specimenLabel: biopsies.specimenLabel,
  clockH: biopsies.clockH,
  distanceCm: biopsies.distanceCm,
  histology: biopsies.histology,
  ainGrade: biopsies.ainGrade,
  p16: biopsies.p16,
  resultEnteredAt: biopsies.resultEnteredAt,
};

export async function listBiopsiesForVisit(scope: SiteScope, visitId: string) {
  const visit = await loadVisit(db, scope, visitId);
  const rows = await db.select(columns).from(biopsies).leftJoin(lesions, eq(lesions.id, biopsies.lesionId)).where(eq(biopsies.visitId, visit.id)).orderBy(asc(biopsies.specimenLabel));
  return { visit: { id: visit.id, patientId: visit.patientId, status: visit.status }, biopsies: rows };
}

const LABELS = "ABCDEFGHIJKLMNOPQRSTUVWXYZ";

/** Specimen labels run A, B, C… per visit, as printed on the requisition. */
export async function createBiopsy(scope: SiteScope, visitId: string, input: CreateBiopsyInput, ip: string) {
  return db.transaction(async (tx) => {
    const visit = await lockDraftVisit(tx, scope, visitId);
    let place: { lesionId: string | null; clockH: number; distanceCm: number };
    if ("lesionId" in input) {
      const [l] = await tx.select().from(lesions).where(and(eq(lesions.id, input.lesionId), eq(lesions.visitId, visit.id)));
      if (!l) throw new AppError("invalid", undefined, { lesionId: ["That lesion is not on this visit."] });
      place = { lesionId: l.id, clockH: l.clockStartH, distanceCm: (l.distanceStartCm + l.distanceEndCm) / 2 };
    } else {
      place = { lesionId: null, ...input };
    }
    const used = new Set((await tx.select({ l: biopsies.specimenLabel }).from(biopsies).where(eq(biopsies.visitId, visit.id))).map((r) => r.l));
    const label = [...LABELS].find((c) => !used.has(c));
    if (!label) throw new AppError("invalid", "A visit holds at most 26 specimens (A to Z).", { _: ["No specimen label left."] });
    const [row] = await tx.insert(biopsies).values({ visitId: visit.id, siteId: visit.siteId, specimenLabel: label, ...place }).returning();
    await refreshTrackStatuses(tx, visit.patientId, visit.siteId);
    await recordAudit({ userId: scope.userId, siteId: visit.siteId, patientId: visit.patientId, action: "biopsy.create", entityType: "biopsy", entityId: row!.id, ip, detail: { label, ...place } }, tx);
    return row!;
  });
}

export async function deleteBiopsy(scope: SiteScope, biopsyId: string, ip: string) {
  await db.transaction(async (tx) => {
    const [b] = await tx.select({ visitId: biopsies.visitId }).from(biopsies).where(and(eq(biopsies.id, biopsyId), inScope(biopsies.siteId, scope)));
    if (!b) throw new AppError("not_found");
    const visit = await lockDraftVisit(tx, scope, b.visitId);
    await tx.delete(biopsies).where(eq(biopsies.id, biopsyId));
    await refreshTrackStatuses(tx, visit.patientId, visit.siteId);
    await recordAudit({ userId: scope.userId, siteId: visit.siteId, patientId: visit.patientId, action: "biopsy.delete", entityType: "biopsy", entityId: biopsyId, ip }, tx);
  });
}

/**
 * The laboratory result comes back after the visit, often after it is signed: entering it is a
 * result, not an edit of the exam, so it is allowed on signed visits, audited, and histology then
 * decides the lesion's grade for tracking.
 */
export async function enterHistology(scope: SiteScope, biopsyId: string, input: HistologyResultInput, ip: string) {
  return db.transaction(async (tx) => {
    const [b] = await tx.select({ id: biopsies.id, visitId: biopsies.visitId, siteId: biopsies.siteId, before: biopsies.histology }).from(biopsies).where(and(eq(biopsies.id, biopsyId), inScope(biopsies.siteId, scope))).for("update");
    if (!b) throw new AppError("not_found");
    const [v] = await tx.select({ patientId: visits.patientId }).from(visits).where(eq(visits.id, b.visitId));
    const [row] = await tx
      .update(biopsies)
      .set({ histology: input.histology, ainGrade: input.ainGrade ?? null, p16: input.p16 ?? null, resultEnteredAt: new Date(), resultEnteredBy: scope.userId })
      .where(eq(biopsies.id, biopsyId))
      .returning();
    await refreshTrackStatuses(tx, v!.patientId, b.siteId);
    await recordAudit({ userId: scope.userId, siteId: b.siteId, patientId: v!.patientId, action: b.before ? "biopsy.result.correct" : "biopsy.result.enter", entityType: "biopsy", entityId: biopsyId, ip, detail: { before: b.before, ...input } }, tx);
    return row!;
  });
}

/** Biopsies still waiting for a result at the caller's sites, oldest first. */
export async function listAwaitingResults(scope: SiteScope) {
  return db
    .select({
      id: biopsies.id,
      specimenLabel: biopsies.specimenLabel,
      visitId: visits.id,
      visitDate: visits.visitDate,
      patientId: patients.id,
      mrn: patients.mrn,
      familyName: patients.familyName,
      givenName: patients.givenName,
      examiner: users.displayName,
      lesionLabel: lesions.label,
      impression: lesions.grade,
      clockH: biopsies.clockH,
      distanceCm: biopsies.distanceCm,
    })
    .from(biopsies)
    .innerJoin(visits, eq(visits.id, biopsies.visitId))
    .innerJoin(patients, eq(patients.id, visits.patientId))
    .innerJoin(users, eq(users.id, visits.examinerId))
    .leftJoin(lesions, eq(lesions.id, biopsies.lesionId))
    .where(and(isNull(biopsies.histology), inScope(biopsies.siteId, scope)))
    .orderBy(asc(visits.visitDate), asc(biopsies.specimenLabel))
    .limit(500);
}
