import "server-only";
import { and, eq } from "drizzle-orm";
import { alias } from "drizzle-orm/pg-core";
import { db, type Db, type Tx } from "../client";
import { sites, users, visits } from "../schema";
import { inScope, type SiteScope } from "./scope";
import { lockDraftVisit } from "./visit-access";
import { refreshTrackStatuses } from "./tracking";
import { recordAudit } from "./audit";
import { AppError } from "@/lib/errors";
import { DEFAULT_CAUTION_FRACTION } from "@/lib/dosing";
import type { ExamDetailsInput } from "@/lib/validation/visit-record";

const examiner = alias(users, "examiner");
const signer = alias(users, "signer");

/** The visit header with every exam field, the examiner's and signer's names and the site's caution level. */
export function getVisitRecord(scope: SiteScope, visitId: string) {
  return readVisitRecord(db, scope, visitId);
}

async function readVisitRecord(run: Db | Tx, scope: SiteScope, visitId: string) {
  const [row] = await run
    .select({
      id: visits.id,
      patientId: visits.patientId,
      siteId: visits.siteId,
      visitDate: visits.visitDate,
      status: visits.status,
      examinerId: visits.examinerId,
      examinerName: examiner.displayName,
      patientPosition: visits.patientPosition,
      indication: visits.indication,
      cytology: visits.cytology,
      hpvResult: visits.hpvResult,
      adequacy: visits.adequacy,
      examStartedAt: visits.examStartedAt,
      examEndedAt: visits.examEndedAt,
      anaesthesia: visits.anaesthesia,
      patientWeightKg: visits.patientWeightKg,
      plan: visits.plan,
      signedAt: visits.signedAt,
      signedByName: signer.displayName,
      version: visits.version,
      updatedAt: visits.updatedAt,
      extentCautionFraction: sites.extentCautionFraction,
    })
    .from(visits)
    .innerJoin(examiner, eq(examiner.id, visits.examinerId))
    .innerJoin(sites, eq(sites.id, visits.siteId))
    .leftJoin(signer, eq(signer.id, visits.signedBy))
    .where(and(eq(visits.id, visitId), inScope(visits.siteId, scope)))
    .limit(1);
  if (!row) throw new AppError("not_found");
  return { ...row, extentCautionFraction: row.extentCautionFraction ?? DEFAULT_CAUTION_FRACTION };
}
export type VisitRecord = Awaited<ReturnType<typeof readVisitRecord>>;

/**
 * Saves the exam details if nobody saved since the caller loaded them (optimistic version).
 * A changed date re-orders the patient's visits, so track statuses are recomputed. The change is
 * audited in the same transaction; returns the visit record as saved.
 */
export async function updateExamDetails(scope: SiteScope, visitId: string, input: ExamDetailsInput, ip: string): Promise<VisitRecord> {
  return db.transaction(async (tx) => {
    const v = await lockDraftVisit(tx, scope, visitId);
    if (v.version !== input.version) throw new AppError("conflict");
    const { version, ...fields } = input;
    const [saved] = await tx
      .update(visits)
      .set({
        visitDate: fields.visitDate,
        patientPosition: fields.patientPosition,
        indication: fields.indication ?? null,
        cytology: fields.cytology,
        hpvResult: fields.hpvResult,
        adequacy: fields.adequacy ?? null,
        examStartedAt: fields.examStartedAt ? new Date(fields.examStartedAt) : null,
        examEndedAt: fields.examEndedAt ? new Date(fields.examEndedAt) : null,
        anaesthesia: fields.anaesthesia ?? null,
        patientWeightKg: fields.patientWeightKg ?? null,
        plan: fields.plan ?? null,
        version: version + 1,
        updatedAt: new Date(),
      })
      .where(eq(visits.id, v.id))
      .returning({ version: visits.version });
    if (fields.visitDate !== v.visitDate) await refreshTrackStatuses(tx, v.patientId, v.siteId);
    // Independent of each other, both after the update: sent together.
    const [, record] = await Promise.all([
      recordAudit({ userId: scope.userId, siteId: v.siteId, patientId: v.patientId, action: "visit.exam.update", entityType: "visit", entityId: v.id, ip, detail: { fields: Object.keys(fields), version: saved!.version } }, tx),
      readVisitRecord(tx, scope, v.id),
    ]);
    return record;
  });
}
