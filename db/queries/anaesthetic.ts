import "server-only";
import { and, asc, eq, gt, ne, sql } from "drizzle-orm";
import { db, type Tx } from "../client";
import { anaestheticDoses, visits } from "../schema";

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

export function dosesOfVisit(visitId: string) {
  return db.select(columns).from(anaestheticDoses).where(eq(anaestheticDoses.visitId, visitId)).orderBy(asc(anaestheticDoses.createdAt));
}

/** What the dose arithmetic needs of the doses already given at the visit. */
export function doseEntriesOfVisit(tx: Tx, visitId: string) {
  return tx
    .select({ agent: anaestheticDoses.agent, concentrationPct: anaestheticDoses.concentrationPct, volumeMl: anaestheticDoses.volumeMl, withEpinephrine: anaestheticDoses.withEpinephrine })
    .from(anaestheticDoses)
    .where(eq(anaestheticDoses.visitId, visitId));
}

/** The patient's doses stored at other visits in the 24 hours before now (a daily maximum counts them). */
export function doseEntriesOfPatientWithin24h(tx: Tx, patientId: string, exceptVisitId: string) {
  return tx
    .select({ agent: anaestheticDoses.agent, concentrationPct: anaestheticDoses.concentrationPct, volumeMl: anaestheticDoses.volumeMl, withEpinephrine: anaestheticDoses.withEpinephrine })
    .from(anaestheticDoses)
    .innerJoin(visits, eq(visits.id, anaestheticDoses.visitId))
    .where(and(eq(visits.patientId, patientId), ne(anaestheticDoses.visitId, exceptVisitId), gt(anaestheticDoses.createdAt, sql`now() - interval '24 hours'`)));
}

export async function insertDose(tx: Tx, values: typeof anaestheticDoses.$inferInsert) {
  const [row] = await tx.insert(anaestheticDoses).values(values).returning({ id: anaestheticDoses.id, doseMg: anaestheticDoses.doseMg });
  return row!;
}

/** True when a dose of that visit was removed. */
export async function deleteDoseRow(tx: Tx, doseId: string, visitId: string): Promise<boolean> {
  const gone = await tx.delete(anaestheticDoses).where(and(eq(anaestheticDoses.id, doseId), eq(anaestheticDoses.visitId, visitId))).returning({ id: anaestheticDoses.id });
  return gone.length > 0;
}
