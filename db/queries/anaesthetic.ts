import "server-only";
import { and, asc, eq } from "drizzle-orm";
import { db } from "../client";
import { anaestheticDoses } from "../schema";
import { loadVisit, lockDraftVisit } from "./visit-access";
import type { SiteScope } from "./scope";
import { AppError } from "@/lib/errors";
import { assessDoses, mgFromPercentAndMl } from "@/lib/dosing";
import { gateDose, type AnaestheticInput } from "@/lib/validation/treatments";

const columns = {
  id: anaestheticDoses.id,
  agent: anaestheticDoses.agent,
  concentrationPct: anaestheticDoses.concentrationPct,
  volumeMl: anaestheticDoses.volumeMl,
  withEpinephrine: anaestheticDoses.withEpinephrine,
  doseMg: anaestheticDoses.doseMg,
  overrideReason: anaestheticDoses.overrideReason,
  overriddenBy: anaestheticDoses.overriddenBy,
  createdAt: anaestheticDoses.createdAt,
};

/** The visit's injections with running totals recomputed from concentration and volume. */
export async function listDoses(scope: SiteScope, visitId: string) {
  const v = await loadVisit(db, scope, visitId);
  const entries = await db.select(columns).from(anaestheticDoses).where(eq(anaestheticDoses.visitId, v.id)).orderBy(asc(anaestheticDoses.createdAt));
  const weightKg = v.patientWeightKg ?? undefined;
  return { visit: v, entries, weightKg: v.patientWeightKg, assessment: assessDoses(entries, weightKg) };
}

/**
 * Stores one injection if the visit's totals stay within the maximum, or over it only with a
 * recorded reason. The visit row is locked first, so two entries saved at once cannot both
 * slip under the limit.
 */
export async function addDose(scope: SiteScope, userId: string, visitId: string, input: AnaestheticInput) {
  return db.transaction(async (tx) => {
    const v = await lockDraftVisit(tx, scope, visitId);
    const existing = await tx
      .select({ agent: anaestheticDoses.agent, concentrationPct: anaestheticDoses.concentrationPct, volumeMl: anaestheticDoses.volumeMl, withEpinephrine: anaestheticDoses.withEpinephrine })
      .from(anaestheticDoses)
      .where(eq(anaestheticDoses.visitId, v.id));
    const entry = { agent: input.agent, concentrationPct: input.concentrationPct, volumeMl: input.volumeMl, withEpinephrine: input.withEpinephrine };
    const gate = gateDose(existing, entry, v.patientWeightKg);
    const reason = input.overrideReason?.trim() || null;
    if (gate.over && !reason) {
      throw new AppError("invalid", gate.message, { overrideReason: [`${gate.message} To record it, give the reason for going over the maximum.`] });
    }
    const [row] = await tx
      .insert(anaestheticDoses)
      .values({
        visitId: v.id,
        siteId: v.siteId,
        ...entry,
        doseMg: mgFromPercentAndMl(entry.concentrationPct, entry.volumeMl),
        overrideReason: gate.over ? reason : null,
        overriddenBy: gate.over ? userId : null,
      })
      .returning({ id: anaestheticDoses.id, doseMg: anaestheticDoses.doseMg });
    return { visit: v, id: row!.id, doseMg: row!.doseMg, gate };
  });
}

export async function deleteDose(scope: SiteScope, visitId: string, doseId: string) {
  return db.transaction(async (tx) => {
    const v = await lockDraftVisit(tx, scope, visitId);
    const gone = await tx.delete(anaestheticDoses).where(and(eq(anaestheticDoses.id, doseId), eq(anaestheticDoses.visitId, v.id))).returning({ id: anaestheticDoses.id });
    if (!gone.length) throw new AppError("not_found");
    return { visit: v };
  });
}
