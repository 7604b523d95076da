import "server-only";
import { and, asc, eq, isNull } from "drizzle-orm";
import { db, type Tx } from "../client";
import { biopsies, lesions, patients, users, visits } from "../schema";
import { inScope, type SiteScope } from "./scope";
import { loadVisit } from "./visit-access";

const columns = {
  id: biopsies.id,
  visitId: biopsies.visitId,
  lesionId: biopsies.lesionId,
  lesionLabel: lesions.label,
  specimenLabel: biopsies.specimenLabel,
  clockH: biopsies.clockH,
  distanceCm: biopsies.distanceCm,
  histology: biopsies.histology,
  ainGrade: biopsies.ainGrade,
  p16: biopsies.p16,
  resultEnteredAt: biopsies.resultEnteredAt,
};

export async function listBiopsiesForVisit(scope: SiteScope, visitId: string) {
  const visit = await loadVisit(db, scope, visitId);
  const rows = await db.select(columns).from(biopsies).leftJoin(lesions, eq(lesions.id, biopsies.lesionId)).where(eq(biopsies.visitId, visit.id)).orderBy(asc(biopsies.specimenLabel));
  return { visit: { id: visit.id, patientId: visit.patientId, status: visit.status }, biopsies: rows };
}

export async function lesionPlaceOnVisit(tx: Tx, lesionId: string, visitId: string) {
  const [l] = await tx
    .select({ id: lesions.id, clockStartH: lesions.clockStartH, clockEndH: lesions.clockEndH, distanceStartCm: lesions.distanceStartCm, distanceEndCm: lesions.distanceEndCm })
    .from(lesions)
    .where(and(eq(lesions.id, lesionId), eq(lesions.visitId, visitId)));
  return l ?? null;
}

export async function specimenLabelsOfVisit(tx: Tx, visitId: string): Promise<Set<string>> {
  return new Set((await tx.select({ l: biopsies.specimenLabel }).from(biopsies).where(eq(biopsies.visitId, visitId))).map((r) => r.l));
}

export async function insertBiopsy(tx: Tx, values: typeof biopsies.$inferInsert) {
  const [row] = await tx.insert(biopsies).values(values).returning();
  return row!;
}

export async function biopsyInScope(tx: Tx, scope: SiteScope, biopsyId: string, opts: { forUpdate?: boolean } = {}) {
  const q = tx
    .select({ id: biopsies.id, visitId: biopsies.visitId, siteId: biopsies.siteId, before: biopsies.histology, patientId: visits.patientId })
    .from(biopsies)
    .innerJoin(visits, eq(visits.id, biopsies.visitId))
    .where(and(eq(biopsies.id, biopsyId), inScope(biopsies.siteId, scope)));
  const [b] = await (opts.forUpdate ? q.for("update", { of: biopsies }) : q);
  return b ?? null;
}

export async function deleteBiopsyRow(tx: Tx, biopsyId: string): Promise<void> {
  await tx.delete(biopsies).where(eq(biopsies.id, biopsyId));
}

export async function updateBiopsyResult(tx: Tx, biopsyId: string, set: Partial<typeof biopsies.$inferInsert>) {
  const [row] = await tx.update(biopsies).set(set).where(eq(biopsies.id, biopsyId)).returning();
  return row!;
}

/** Biopsies still waiting for a result at the caller's sites, oldest first. */
export async function listAwaitingResults(scope: SiteScope) {
  return db
    .select({
      id: biopsies.id,
      specimenLabel: biopsies.specimenLabel,
      visitId: visits.id,
      visitDate: visits.visitDate,
      patientId: patients.id,
      mrn: patients.mrn,
      familyName: patients.familyName,
      givenName: patients.givenName,
      examiner: users.displayName,
      lesionLabel: lesions.label,
      impression: lesions.grade,
      clockH: biopsies.clockH,
      distanceCm: biopsies.distanceCm,
    })
    .from(biopsies)
    .innerJoin(visits, eq(visits.id, biopsies.visitId))
    .innerJoin(patients, eq(patients.id, visits.patientId))
    .innerJoin(users, eq(users.id, visits.examinerId))
    .leftJoin(lesions, eq(lesions.id, biopsies.lesionId))
    .where(and(isNull(biopsies.histology), inScope(biopsies.siteId, scope)))
    .orderBy(asc(visits.visitDate), asc(biopsies.specimenLabel))
    .limit(500);
}
