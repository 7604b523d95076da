import "server-only";
import { and, asc, eq } from "drizzle-orm";
import { db, type Db, type Tx } from "../client";
import { lesions, sites, treatments } from "../schema";
import { loadVisit, lockDraftVisit } from "./visit-access";
import { refreshTrackStatuses } from "./tracking";
import type { SiteScope } from "./scope";
import { AppError } from "@/lib/errors";
import { assessExtent, DEFAULT_CAUTION_FRACTION } from "@/lib/dosing";
import { gateExtent, type TreatmentInput } from "@/lib/validation/treatments";

const columns = {
  id: treatments.id,
  lesionId: treatments.lesionId,
  lesionLabel: lesions.label,
  modality: treatments.modality,
  regimen: treatments.regimen,
  arcs: treatments.arcs,
  treatedFraction: treatments.treatedFraction,
  extentOverrideReason: treatments.extentOverrideReason,
  note: treatments.note,
  createdAt: treatments.createdAt,
};

async function cautionFractionOf(run: Db | Tx, siteId: string): Promise<number> {
  const [s] = await run.select({ f: sites.extentCautionFraction }).from(sites).where(eq(sites.id, siteId)).limit(1);
  return s?.f ?? DEFAULT_CAUTION_FRACTION;
}

function listRows(run: Db | Tx, visitId: string) {
  return run.select(columns).from(treatments).leftJoin(lesions, eq(lesions.id, treatments.lesionId)).where(eq(treatments.visitId, visitId)).orderBy(asc(treatments.createdAt));
}

/**
 * Every treatment row carries the visit's treated union at the last write, so a report
 * reading any one row sees the session's figure; it is recomputed on each add and delete.
 */
async function restampUnion(tx: Tx, visitId: string, cautionFraction: number) {
  const rows = await tx.select({ arcs: treatments.arcs }).from(treatments).where(eq(treatments.visitId, visitId));
  const extent = assessExtent(rows.flatMap((r) => r.arcs), cautionFraction);
  await tx.update(treatments).set({ treatedFraction: extent.fraction }).where(eq(treatments.visitId, visitId));
  return extent;
}

export async function listTreatments(scope: SiteScope, visitId: string) {
  const v = await loadVisit(db, scope, visitId);
  const rows = await listRows(db, v.id);
  const cautionFraction = await cautionFractionOf(db, v.siteId);
  return { visit: v, treatments: rows, extent: assessExtent(rows.flatMap((r) => r.arcs), cautionFraction), cautionFraction };
}

const EXTENT_REASON_FIELD = "extentOverrideReason";

export async function addTreatment(scope: SiteScope, visitId: string, input: TreatmentInput) {
  return db.transaction(async (tx) => {
    const v = await lockDraftVisit(tx, scope, visitId);
    if (input.lesionId) {
      const [l] = await tx.select({ id: lesions.id }).from(lesions).where(and(eq(lesions.id, input.lesionId), eq(lesions.visitId, v.id))).limit(1);
      if (!l) throw new AppError("invalid", undefined, { lesionId: ["Choose a lesion mapped at this visit."] });
    }
    const cautionFraction = await cautionFractionOf(tx, v.siteId);
    const existing = await tx.select({ arcs: treatments.arcs }).from(treatments).where(eq(treatments.visitId, v.id));
    const arcs = input.arcs.map((a) => ({ startH: a.startH, endH: a.endH }));
    const gate = gateExtent(existing.flatMap((r) => r.arcs), arcs, cautionFraction);
    const reason = input.extentOverrideReason?.trim() || null;
    if (gate.needsReason && !reason) {
      throw new AppError("invalid", gate.assessment.message, {
        [EXTENT_REASON_FIELD]: [`${gate.assessment.message} To save it, give the reason for treating this much in one session.`],
      });
    }
    const [row] = await tx
      .insert(treatments)
      .values({
        visitId: v.id,
        siteId: v.siteId,
        lesionId: input.lesionId ?? null,
        modality: input.modality,
        regimen: input.regimen || null,
        arcs,
        treatedFraction: gate.assessment.fraction,
        extentOverrideReason: gate.needsReason ? reason : null,
        note: input.note || null,
      })
      .returning({ id: treatments.id });
    const extent = await restampUnion(tx, v.id, cautionFraction);
    await refreshTrackStatuses(tx, v.patientId, v.siteId);
    return { visit: v, id: row!.id, extent, overridden: gate.needsReason, cautionFraction };
  });
}

export async function deleteTreatment(scope: SiteScope, visitId: string, treatmentId: string) {
  return db.transaction(async (tx) => {
    const v = await lockDraftVisit(tx, scope, visitId);
    const gone = await tx.delete(treatments).where(and(eq(treatments.id, treatmentId), eq(treatments.visitId, v.id))).returning({ id: treatments.id });
    if (!gone.length) throw new AppError("not_found");
    const extent = await restampUnion(tx, v.id, await cautionFractionOf(tx, v.siteId));
    await refreshTrackStatuses(tx, v.patientId, v.siteId);
    return { visit: v, extent };
  });
}
