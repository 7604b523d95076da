import "server-only";
import { and, asc, eq, sql as dsql } from "drizzle-orm";
import { type Db, type Tx } from "../client";
import { lesions, sites, treatments } from "../schema";

const columns = {
  id: treatments.id,
  lesionId: treatments.lesionId,
  lesionLabel: lesions.label,
  modality: treatments.modality,
  regimen: treatments.regimen,
  arcs: treatments.arcs,
  treatedLesionIds: treatments.treatedLesionIds,
  treatedFraction: treatments.treatedFraction,
  extentOverrideReason: treatments.extentOverrideReason,
  cancerOverrideReason: treatments.cancerOverrideReason,
  note: treatments.note,
  createdAt: treatments.createdAt,
};

/** The site's circumference caution level, null when the site keeps the default. */
export async function siteCautionFraction(run: Db | Tx, siteId: string): Promise<number | null> {
  const [s] = await run.select({ f: sites.extentCautionFraction }).from(sites).where(eq(sites.id, siteId)).limit(1);
  return s?.f ?? null;
}

export function treatmentsOfVisit(run: Db | Tx, visitId: string) {
  return run.select(columns).from(treatments).leftJoin(lesions, eq(lesions.id, treatments.lesionId)).where(eq(treatments.visitId, visitId)).orderBy(asc(treatments.createdAt));
}

export async function treatedArcsOfVisit(tx: Tx, visitId: string) {
  return (await tx.select({ arcs: treatments.arcs }).from(treatments).where(eq(treatments.visitId, visitId))).flatMap((r) => r.arcs);
}

/** Every treatment row of the visit carries the visit's treated union. */
export async function stampVisitTreatedFraction(tx: Tx, visitId: string, fraction: number): Promise<void> {
  await tx.update(treatments).set({ treatedFraction: fraction }).where(eq(treatments.visitId, visitId));
}

export async function lesionIsOnVisit(tx: Tx, lesionId: string, visitId: string): Promise<boolean> {
  const [l] = await tx.select({ id: lesions.id }).from(lesions).where(and(eq(lesions.id, lesionId), eq(lesions.visitId, visitId))).limit(1);
  return Boolean(l);
}

/** The lesion's clock extent when it belongs to the visit, else null. */
export async function lesionArcOnVisit(tx: Tx, lesionId: string, visitId: string): Promise<{ startH: number; endH: number } | null> {
  const [l] = await tx.select({ startH: lesions.clockStartH, endH: lesions.clockEndH }).from(lesions).where(and(eq(lesions.id, lesionId), eq(lesions.visitId, visitId))).limit(1);
  return l ?? null;
}

/** The visit's lesions with their extent, impression grade and whether a biopsy of them shows carcinoma. */
export async function lesionRisksOfVisit(tx: Tx, visitId: string) {
  return tx
    .select({
      id: lesions.id, label: lesions.label, startH: lesions.clockStartH, endH: lesions.clockEndH, grade: lesions.grade,
      carcinomaOnHistology: dsql<boolean>`exists(select 1 from biopsies b where b.lesion_id = "lesions"."id" and b.histology = 'scc')`,
    })
    .from(lesions)
    .where(eq(lesions.visitId, visitId));
}

export async function insertTreatment(tx: Tx, values: typeof treatments.$inferInsert): Promise<string> {
  const [row] = await tx.insert(treatments).values(values).returning({ id: treatments.id });
  return row!.id;
}

/** True when a treatment of that visit was removed. */
export async function deleteTreatmentRow(tx: Tx, treatmentId: string, visitId: string): Promise<boolean> {
  const gone = await tx.delete(treatments).where(and(eq(treatments.id, treatmentId), eq(treatments.visitId, visitId))).returning({ id: treatments.id });
  return gone.length > 0;
}
