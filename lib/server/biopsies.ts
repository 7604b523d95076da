import "server-only";
import { db } from "@/db/client";
import { biopsyInScope, deleteBiopsyRow, insertBiopsy, lesionPlaceOnVisit, listBiopsiesForVisit, specimenLabelsOfVisit, updateBiopsyResult } from "@/db/queries/biopsies";
import { loadVisit, lockDraftVisit } from "@/db/queries/visit-access";
import { lockPatientStatusesOfBiopsy, lockPatientStatusesOfVisit } from "@/db/queries/patient-lock";
import { recordAudit } from "@/db/queries/audit-write";
import type { SiteScope } from "@/db/queries/scope";
import { AppError } from "@/lib/errors";
import { arcMidpointH } from "@/lib/geometry/arcs";
import type { CreateBiopsyInput, HistologyResultInput } from "@/lib/validation/biopsies";
import { refreshTrackStatuses } from "./track-statuses";

const LABELS = "ABCDEFGHIJKLMNOPQRSTUVWXYZ";

/** Specimen labels run A, B, C… per visit, as printed on the requisition. */
/** A visit's specimens, the read audited as a read of the visit (`visit.biopsies.read`). */
export async function readBiopsiesOfVisit(scope: SiteScope, visitId: string, ip: string) {
  const [visit, result] = await Promise.all([loadVisit(db, scope, visitId), listBiopsiesForVisit(scope, visitId)]);
  await recordAudit({ userId: scope.userId, siteId: visit.siteId, patientId: visit.patientId, action: "visit.biopsies.read", entityType: "visit", entityId: visit.id, ip });
  return result;
}

export async function createBiopsy(scope: SiteScope, visitId: string, input: CreateBiopsyInput, ip: string) {
  return db.transaction(async (tx) => {
    const [, visit] = await Promise.all([lockPatientStatusesOfVisit(tx, scope, visitId), lockDraftVisit(tx, scope, visitId)]);
    let place: { lesionId: string | null; clockH: number; distanceCm: number };
    if ("lesionId" in input) {
      const l = await lesionPlaceOnVisit(tx, input.lesionId, visit.id);
      if (!l) throw new AppError("invalid", undefined, { lesionId: ["That lesion is not on this visit."] });
      // The specimen is placed at the lesion's middle in both directions, where the map tag sits.
      const clockH = arcMidpointH({ startH: l.clockStartH, endH: l.clockEndH });
      place = { lesionId: l.id, clockH, distanceCm: (l.distanceStartCm + l.distanceEndCm) / 2 };
    } else {
      place = { lesionId: null, ...input };
    }
    const used = await specimenLabelsOfVisit(tx, visit.id);
    const label = [...LABELS].find((c) => !used.has(c));
    if (!label) throw new AppError("invalid", "A visit holds at most 26 specimens (A to Z).", { _: ["No specimen label left."] });
    const row = await insertBiopsy(tx, { visitId: visit.id, siteId: visit.siteId, specimenLabel: label, ...place });
    await refreshTrackStatuses(tx, visit.patientId, visit.siteId);
    await recordAudit({ userId: scope.userId, siteId: visit.siteId, patientId: visit.patientId, action: "biopsy.create", entityType: "biopsy", entityId: row.id, ip, detail: { label, ...place } }, tx);
    return row;
  });
}

export async function deleteBiopsy(scope: SiteScope, biopsyId: string, ip: string) {
  await db.transaction(async (tx) => {
    const [, b] = await Promise.all([lockPatientStatusesOfBiopsy(tx, scope, biopsyId), biopsyInScope(tx, scope, biopsyId)]);
    if (!b) throw new AppError("not_found");
    const visit = await lockDraftVisit(tx, scope, b.visitId);
    await deleteBiopsyRow(tx, biopsyId);
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
    const [, b] = await Promise.all([lockPatientStatusesOfBiopsy(tx, scope, biopsyId), biopsyInScope(tx, scope, biopsyId, { forUpdate: true })]);
    if (!b) throw new AppError("not_found");
    const row = await updateBiopsyResult(tx, biopsyId, { histology: input.histology, ainGrade: input.ainGrade ?? null, p16: input.p16 ?? null, resultEnteredAt: new Date(), resultEnteredBy: scope.userId });
    await refreshTrackStatuses(tx, b.patientId, b.siteId);
    await recordAudit({ userId: scope.userId, siteId: b.siteId, patientId: b.patientId, action: b.before ? "biopsy.result.correct" : "biopsy.result.enter", entityType: "biopsy", entityId: biopsyId, ip, detail: { before: b.before, ...input } }, tx);
    return row;
  });
}
