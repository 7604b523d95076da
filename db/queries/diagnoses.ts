import "server-only";
import { and, asc, eq } from "drizzle-orm";
import { db, type Db, type Tx } from "../client";
import { biopsies, lesions, users, visitDiagnoses, visits } from "../schema";

/** What coding reads of a visit: its cytology and HPV result, its lesions and its biopsies. */
export async function codingRowsOfVisit(run: Db | Tx, visitId: string) {
  const [v] = await run.select({ cytology: visits.cytology, hpv: visits.hpvResult }).from(visits).where(eq(visits.id, visitId)).limit(1);
  const lesionRows = await run
    .select({ id: lesions.id, grade: lesions.grade, distanceStartCm: lesions.distanceStartCm, distanceEndCm: lesions.distanceEndCm })
    .from(lesions)
    .where(eq(lesions.visitId, visitId));
  const biopsyRows = await run
    .select({ lesionId: biopsies.lesionId, histology: biopsies.histology, ain: biopsies.ainGrade, p16: biopsies.p16, distanceCm: biopsies.distanceCm })
    .from(biopsies)
    .where(eq(biopsies.visitId, visitId));
  return { visit: v, lesions: lesionRows, biopsies: biopsyRows };
}

export function confirmedDiagnosesOfVisit(visitId: string) {
  return db
    .select({ code: visitDiagnoses.code, descriptor: visitDiagnoses.descriptor, confirmedAt: visitDiagnoses.confirmedAt, confirmedByName: users.displayName })
    .from(visitDiagnoses)
    .innerJoin(users, eq(users.id, visitDiagnoses.confirmedBy))
    .where(eq(visitDiagnoses.visitId, visitId))
    .orderBy(asc(visitDiagnoses.code));
}

export async function insertDiagnosis(tx: Tx, values: typeof visitDiagnoses.$inferInsert): Promise<void> {
  await tx.insert(visitDiagnoses).values(values).onConflictDoNothing();
}

export async function deleteDiagnosisRow(tx: Tx, visitId: string, code: string): Promise<boolean> {
  const gone = await tx.delete(visitDiagnoses).where(and(eq(visitDiagnoses.visitId, visitId), eq(visitDiagnoses.code, code))).returning({ id: visitDiagnoses.id });
  return gone.length > 0;
}
