import "server-only";
import { db } from "@/db/client";
import { getVisitRecord, readVisitRecord, saveExam, type VisitRecord } from "@/db/queries/visit-record";
import { lockDraftVisitForExam } from "@/db/queries/visit-access";
import { recordAudit } from "@/db/queries/audit-write";
import type { SiteScope } from "@/db/queries/scope";
import { AppError } from "@/lib/errors";
import type { ExamDetailsInput } from "@/lib/validation/visit-record";
import { careDayProblem } from "@/lib/validation/dates";

/** The visit record, the read audited. */
export async function readVisit(scope: SiteScope, visitId: string, ip: string): Promise<VisitRecord> {
  const visit = await getVisitRecord(scope, visitId);
  await recordAudit({ userId: scope.userId, siteId: visit.siteId, patientId: visit.patientId, action: "visit.read", entityType: "visit", entityId: visit.id, ip });
  return visit;
}

type StoredExam = Awaited<ReturnType<typeof lockDraftVisitForExam>>;
const same = (a: unknown, b: unknown) => (a ?? null) === (b ?? null);
// Instants compare as instants: the form sends an ISO time with its offset, the row holds a timestamptz.
const sameInstant = (a: string | null | undefined, b: Date | string | null) => (a == null || b == null ? same(a, b) : Date.parse(a) === new Date(b).getTime());

/** Whether saving these exam details would store exactly what is stored (a field left out is stored as empty). */
function unchangedExam(f: Omit<ExamDetailsInput, "version">, v: StoredExam): boolean {
  return (
    f.visitDate === v.visitDate && f.patientPosition === v.patientPosition && f.cytology === v.cytology && f.hpvResult === v.hpvResult &&
    same(f.indication, v.indication) && same(f.adequacy, v.adequacy) && same(f.anaesthesia, v.anaesthesia) && same(f.patientWeightKg, v.patientWeightKg) &&
    same(f.plan, v.plan) && sameInstant(f.examStartedAt, v.examStartedAt) && sameInstant(f.examEndedAt, v.examEndedAt)
  );
}

/**
 * Saves the exam details if nobody saved since the caller loaded them (optimistic version).
 * The change is audited in the same transaction; returns the visit record as saved.
 */
export async function updateExamDetails(scope: SiteScope, visitId: string, input: ExamDetailsInput, ip: string): Promise<VisitRecord> {
  return db.transaction(async (tx) => {
    // Only a draft's exam is saved here, and a draft drives no track status (statuses come from
    // signed visits): no status lock, and a changed date re-orders nothing that is stored.
    const v = await lockDraftVisitForExam(tx, scope, visitId);
    if (v.version !== input.version) throw new AppError("conflict");
    const { version, ...fields } = input;
    // A save whose values all equal the stored ones changes nothing: no new version, no audit row;
    // the record is answered as it is.
    if (unchangedExam(fields, v)) return readVisitRecord(tx, scope, v.id);
    // The schema bounds the days by today; the patient's birth (read with the lock) bounds them here.
    const birthDate = v.patientBirthDate;
    const fieldProblems: Record<string, string[]> = {};
    for (const key of ["visitDate", "examStartedAt", "examEndedAt"] as const) {
      const value = fields[key];
      const problem = value ? careDayProblem(key === "visitDate" ? value : new Date(value).toISOString(), { birthDate }) : null;
      if (problem) fieldProblems[key] = [problem];
    }
    if (Object.keys(fieldProblems).length) throw new AppError("invalid", undefined, fieldProblems);
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
    return record;
  });
}
