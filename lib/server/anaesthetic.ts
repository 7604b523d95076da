import "server-only";
import { deleteDoseRow, doseEntriesOfPatientWithin24h, doseEntriesOfVisit, dosesOfVisit, insertDose } from "@/db/queries/anaesthetic";
import type { SiteScope } from "@/db/queries/scope";
import { AppError } from "@/lib/errors";
import { assessDoses, mgFromPercentAndMl } from "@/lib/dosing";
import { gateDose, type AnaestheticInput } from "@/lib/validation/treatments";
import { changeDraftVisit, readVisitPart } from "./visit-parts";

/** The visit's injections with running totals recomputed from concentration and volume. */
export function listDoses(scope: SiteScope, visitId: string, ip: string) {
  return readVisitPart(scope, visitId, ip, "anaesthetic", async (v) => {
    const entries = await dosesOfVisit(v.id);
    return { entries, weightKg: v.patientWeightKg, assessment: assessDoses(entries, v.patientWeightKg ?? undefined) };
  });
}

/**
 * Stores one injection if the visit's totals stay within the maximum, or over it only with a
 * recorded reason. The visit row is locked first, so two entries saved at once cannot both
 * slip under the limit.
 */
export function addDose(scope: SiteScope, visitId: string, input: AnaestheticInput, ip: string) {
  return changeDraftVisit(
    scope, visitId, ip,
    async (tx, v) => {
      const entry = { agent: input.agent, concentrationPct: input.concentrationPct, volumeMl: input.volumeMl, withEpinephrine: input.withEpinephrine };
      // A daily maximum (bupivacaine) counts the patient's doses at other visits in the last 24 hours.
      const earlier = await doseEntriesOfPatientWithin24h(tx, v.patientId, v.id);
      const gate = gateDose(await doseEntriesOfVisit(tx, v.id), entry, v.patientWeightKg, earlier);
      const reason = input.overrideReason?.trim() || null;
      if (gate.over && !reason) {
        throw new AppError("invalid", gate.message, { overrideReason: [`${gate.message} To record it, give the reason for going over the maximum.`] });
      }
      const row = await insertDose(tx, {
        visitId: v.id,
        siteId: v.siteId,
        ...entry,
        doseMg: mgFromPercentAndMl(entry.concentrationPct, entry.volumeMl),
        overrideReason: gate.over ? reason : null,
        overriddenBy: gate.over ? scope.userId : null,
      });
      return { id: row.id, doseMg: row.doseMg, gate };
    },
    (r) => ({
      action: r.gate.over ? "anaesthetic.create.override" : "anaesthetic.create", entityType: "anaesthetic_dose", entityId: r.id,
      detail: { agent: input.agent, doseMg: r.doseMg, over: r.gate.over, near: r.gate.near, message: r.gate.message, overrideReason: r.gate.over ? input.overrideReason : undefined },
    }),
  );
}

export function deleteDose(scope: SiteScope, visitId: string, doseId: string, ip: string) {
  return changeDraftVisit(
    scope, visitId, ip,
    async (tx, v) => {
      if (!(await deleteDoseRow(tx, doseId, v.id))) throw new AppError("not_found");
    },
    () => ({ action: "anaesthetic.delete", entityType: "anaesthetic_dose", entityId: doseId }),
  );
}
