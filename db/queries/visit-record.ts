import "server-only";
import { and, eq, sql as dsql } from "drizzle-orm";
import { alias } from "drizzle-orm/pg-core";
import { db, prepared, type Db, type Tx } from "../client";
import { sites, users, visits } from "../schema";
import { inScopeParam, siteIdsParam, type SiteScope } from "./scope";
import { lockDraftVisit } from "./visit-access";
import { refreshTrackStatuses } from "./tracking";
import { recordAudit } from "./audit-write";
import { AppError } from "@/lib/errors";
import { DEFAULT_CAUTION_FRACTION } from "@/lib/dosing";
import type { ExamDetailsInput } from "@/lib/validation/visit-record";

const examiner = alias(users, "examiner");
const signer = alias(users, "signer");

/** The visit header with every exam field, the examiner's and signer's names and the site's caution level. */
export function getVisitRecord(scope: SiteScope, visitId: string) {
  return readVisitRecord(db, scope, visitId);
}

// Built once: every visit screen and every exam save reads it.
const visitRecord = prepared((run) =>
  run
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
    .where(and(eq(visits.id, dsql.placeholder("visitId")), inScopeParam(visits.siteId)))
    .limit(1),
);

async function readVisitRecord(run: Db | Tx, scope: SiteScope, visitId: string) {
  const [row] = await visitRecord(run, { visitId, siteIds: siteIdsParam(scope) });
  if (!row) throw new AppError("not_found");
  return { ...row, extentCautionFraction: row.extentCautionFraction ?? DEFAULT_CAUTION_FRACTION };
}
export type VisitRecord = Awaited<ReturnType<typeof readVisitRecord>>;

// A value bound as is (dates go in as ISO text, as drizzle would send them).
const p = (name: string) => dsql`${dsql.placeholder(name)}`;
// Built once: the exam form saves every field each time.
const saveExam = prepared((run) =>
  run
    .update(visits)
    .set({
      visitDate: p("visitDate"),
      patientPosition: p("patientPosition"),
      indication: p("indication"),
      cytology: p("cytology"),
      hpvResult: p("hpvResult"),
      adequacy: p("adequacy"),
      examStartedAt: p("examStartedAt"),
      examEndedAt: p("examEndedAt"),
      anaesthesia: p("anaesthesia"),
      patientWeightKg: p("patientWeightKg"),
      plan: p("plan"),
      version: p("version"),
      updatedAt: p("updatedAt"),
    })
    .where(eq(visits.id, dsql.placeholder("id")))
    .returning({ version: visits.version }),
);

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
    const saved = { version: version + 1 };
    // Sent together, in the order they are started here on the transaction's one connection: the
    // update, then (seeing it) the audit and the record as saved.
    const [, , record] = await Promise.all([
      saveExam(tx, {
        id: v.id,
        visitDate: fields.visitDate,
        patientPosition: fields.patientPosition,
        indication: fields.indication ?? null,
        cytology: fields.cytology,
        hpvResult: fields.hpvResult,
        adequacy: fields.adequacy ?? null,
        examStartedAt: fields.examStartedAt ? new Date(fields.examStartedAt).toISOString() : null,
        examEndedAt: fields.examEndedAt ? new Date(fields.examEndedAt).toISOString() : null,
        anaesthesia: fields.anaesthesia ?? null,
        patientWeightKg: fields.patientWeightKg ?? null,
        plan: fields.plan ?? null,
        version: saved.version,
        updatedAt: new Date().toISOString(),
      }),
      recordAudit({ userId: scope.userId, siteId: v.siteId, patientId: v.patientId, action: "visit.exam.update", entityType: "visit", entityId: v.id, ip, detail: { fields: Object.keys(fields), version: saved.version } }, tx),
      readVisitRecord(tx, scope, v.id),
    ]);
    // A changed date re-orders the patient's visits.
    if (fields.visitDate !== v.visitDate) await refreshTrackStatuses(tx, v.patientId, v.siteId);
    return record;
  });
}
