import "server-only";
import { db, type Db, type Tx } from "@/db/client";
import { deleteTreatmentRow, insertTreatment, lesionArcOnVisit, lesionRisksOfVisit, siteCautionFraction, stampVisitTreatedFraction, treatedArcsOfVisit, treatmentsOfVisit } from "@/db/queries/treatments";
import { loadVisit, lockDraftVisit } from "@/db/queries/visit-access";
import { lockPatientStatusesOfVisit } from "@/db/queries/patient-lock";
import { recordAudit } from "@/db/queries/audit-write";
import type { SiteScope } from "@/db/queries/scope";
import { AppError } from "@/lib/errors";
import { assessExtent, DEFAULT_CAUTION_FRACTION } from "@/lib/dosing";
import { cancerCautionMessage, cancerLesionsReached, gateExtent, isTopical, partialCoverMessage, treatedLesions, type TreatmentInput } from "@/lib/validation/treatments";
import { refreshTrackStatuses } from "./track-statuses";

async function cautionFractionOf(run: Db | Tx, siteId: string): Promise<number> {
  return (await siteCautionFraction(run, siteId)) ?? DEFAULT_CAUTION_FRACTION;
}

/**
 * Every treatment row carries the visit's treated union at the last write, so a report
 * reading any one row sees the session's figure; it is recomputed on each add and delete.
 */
async function restampUnion(tx: Tx, visitId: string, cautionFraction: number) {
  const extent = assessExtent(await treatedArcsOfVisit(tx, visitId), cautionFraction);
  await stampVisitTreatedFraction(tx, visitId, extent.fraction);
  return extent;
}

/** A visit's treatments and the session's treated extent; the read audited. */
export async function listTreatments(scope: SiteScope, visitId: string, ip: string) {
  const v = await loadVisit(db, scope, visitId);
  const [rows, cautionFraction] = await Promise.all([treatmentsOfVisit(db, v.id), cautionFractionOf(db, v.siteId)]);
  await recordAudit({ userId: scope.userId, siteId: v.siteId, patientId: v.patientId, action: "visit.treatments.read", entityType: "visit", entityId: v.id, ip });
  return { treatments: rows, extent: assessExtent(rows.flatMap((r) => r.arcs), cautionFraction), cautionFraction };
}

const EXTENT_REASON_FIELD = "extentOverrideReason";

/** The server computes the treated union itself; a reason is required from the caution level up. */
export async function addTreatment(scope: SiteScope, visitId: string, input: TreatmentInput, ip: string) {
  return db.transaction(async (tx) => {
    const [, v] = await Promise.all([lockPatientStatusesOfVisit(tx, scope, visitId), lockDraftVisit(tx, scope, visitId)]);
    const lesionArc = input.lesionId ? await lesionArcOnVisit(tx, input.lesionId, v.id) : null;
    if (input.lesionId && !lesionArc) {
      throw new AppError("invalid", undefined, { lesionId: ["Choose a lesion mapped at this visit."] });
    }
    const cautionFraction = await cautionFractionOf(tx, v.siteId);
    // A named lesion treated without arcs was treated over its mapped extent, so that extent
    // is stored and counts toward the session's circumference check (a topical agent has no arc).
    const given = input.arcs.map((a) => ({ startH: a.startH, endH: a.endH }));
    const arcs = given.length === 0 && lesionArc && !isTopical(input.modality) ? [lesionArc] : given;
    const gate = gateExtent(await treatedArcsOfVisit(tx, v.id), arcs, cautionFraction);
    const reason = input.extentOverrideReason?.trim() || null;
    const lesionsOfVisit = await lesionRisksOfVisit(tx, v.id);
    const reached = cancerLesionsReached(lesionsOfVisit, input.lesionId, arcs, input.modality);
    // Which lesions this treats is decided now and stored: arcs covering a lesion's extent fully
    // treat it; one reached in part is the clinician's call, asked for before anything is stored.
    const treated = treatedLesions(lesionsOfVisit, input.lesionId, arcs, input.partialCover);
    const cancerReason = reached.length ? input.cancerOverrideReason?.trim() || null : null;
    // Both reasons are asked for at once, so the clinician answers one prompt, not two in turn.
    const missing: Record<string, string[]> = {};
    if (gate.needsReason && !reason) missing[EXTENT_REASON_FIELD] = [`${gate.assessment.message} To save it, give the reason for treating this much in one session.`];
    if (reached.length && !cancerReason) missing.cancerOverrideReason = [`${cancerCautionMessage(reached)} To save it, give the reason for treating it.`];
    if (treated.undecided.length) missing.partialCover = [partialCoverMessage(treated.undecided)];
    if (Object.keys(missing).length) {
      const message = reached.length && !cancerReason ? cancerCautionMessage(reached) : gate.needsReason && !reason ? gate.assessment.message : partialCoverMessage(treated.undecided);
      throw new AppError("invalid", message, missing);
    }
    const id = await insertTreatment(tx, {
      visitId: v.id,
      siteId: v.siteId,
      lesionId: input.lesionId ?? null,
      treatedLesionIds: treated.ids,
      modality: input.modality,
      regimen: input.regimen || null,
      arcs,
      treatedFraction: gate.assessment.fraction,
      extentOverrideReason: gate.needsReason ? reason : null,
      cancerOverrideReason: cancerReason,
      note: input.note || null,
    });
    const extent = await restampUnion(tx, v.id, cautionFraction);
    await refreshTrackStatuses(tx, v.patientId, v.siteId);
    await recordAudit({
      userId: scope.userId, siteId: v.siteId, patientId: v.patientId, action: "treatment.create", entityType: "treatment", entityId: id, ip,
      detail: { modality: input.modality, arcs, arcsFromLesion: given.length === 0 && arcs.length > 0, visitTreatedFraction: extent.fraction, cautionFraction, extentOverrideReason: gate.needsReason ? input.extentOverrideReason : undefined,
        cancerOverrideReason: cancerReason ?? undefined, cancerLesions: reached.length ? reached.map((l) => l.label) : undefined,
        treatedLesions: lesionsOfVisit.filter((l) => treated.ids.includes(l.id)).map((l) => l.label), partialCover: input.partialCover },
    }, tx);
    return { id, extent, overridden: gate.needsReason, cautionFraction };
  });
}

export async function deleteTreatment(scope: SiteScope, visitId: string, treatmentId: string, ip: string) {
  return db.transaction(async (tx) => {
    const [, v] = await Promise.all([lockPatientStatusesOfVisit(tx, scope, visitId), lockDraftVisit(tx, scope, visitId)]);
    if (!(await deleteTreatmentRow(tx, treatmentId, v.id))) throw new AppError("not_found");
    const extent = await restampUnion(tx, v.id, await cautionFractionOf(tx, v.siteId));
    await refreshTrackStatuses(tx, v.patientId, v.siteId);
    await recordAudit({ userId: scope.userId, siteId: v.siteId, patientId: v.patientId, action: "treatment.delete", entityType: "treatment", entityId: treatmentId, ip }, tx);
    return { extent };
  });
}
