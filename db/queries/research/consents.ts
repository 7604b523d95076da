import "server-only";
import { and, asc, eq, inArray, isNull } from "drizzle-orm";
import { db, type Tx } from "../../client";
import { researchConsents, sites, studies, studySites } from "../../schema";
import { inScope, type SiteScope } from "../scope";

export async function studyCodeTaken(tx: Tx, code: string, exceptId?: string): Promise<boolean> {
  const rows = await tx.select({ id: studies.id }).from(studies).where(eq(studies.code, code));
  return rows.some((r) => r.id !== exceptId);
}

export async function insertStudy(tx: Tx, values: { code: string; title: string; startDate: string; consentFormVersion: string }, siteIds: string[]) {
  const [row] = await tx.insert(studies).values(values).returning();
  await tx.insert(studySites).values(siteIds.map((siteId) => ({ studyId: row!.id, siteId })));
  return row!;
}

export async function studyForUpdate(tx: Tx, studyId: string) {
  const [row] = await tx.select().from(studies).where(eq(studies.id, studyId)).for("update");
  if (!row) return null;
  const siteRows = await tx.select({ siteId: studySites.siteId }).from(studySites).where(eq(studySites.studyId, studyId));
  return { ...row, siteIds: siteRows.map((r) => r.siteId).sort() };
}

export async function updateStudyRow(tx: Tx, studyId: string, set: Partial<{ code: string; title: string; startDate: string; consentFormVersion: string }>): Promise<void> {
  if (Object.keys(set).length) await tx.update(studies).set(set).where(eq(studies.id, studyId));
}

export async function setStudySites(tx: Tx, studyId: string, add: string[], remove: string[]): Promise<void> {
  if (add.length) await tx.insert(studySites).values(add.map((siteId) => ({ studyId, siteId }))).onConflictDoNothing();
  if (remove.length) await tx.delete(studySites).where(and(eq(studySites.studyId, studyId), inArray(studySites.siteId, remove)));
}

/** The study, when it runs at the site. */
export async function studyAtSite(tx: Tx, studyId: string, siteId: string) {
  const [row] = await tx
    .select({ id: studies.id, code: studies.code, consentFormVersion: studies.consentFormVersion, startDate: studies.startDate })
    .from(studies)
    .innerJoin(studySites, and(eq(studySites.studyId, studies.id), eq(studySites.siteId, siteId)))
    .where(eq(studies.id, studyId));
  return row ?? null;
}

export async function currentConsent(tx: Tx, patientId: string, studyId: string) {
  const [row] = await tx.select({ id: researchConsents.id }).from(researchConsents).where(and(eq(researchConsents.patientId, patientId), eq(researchConsents.studyId, studyId), isNull(researchConsents.withdrawnOn)));
  return row ?? null;
}

export async function insertConsent(tx: Tx, values: typeof researchConsents.$inferInsert): Promise<string> {
  const [row] = await tx.insert(researchConsents).values(values).returning({ id: researchConsents.id });
  return row!.id;
}

export async function consentOfPatientForUpdate(tx: Tx, scope: SiteScope, patientId: string, consentId: string) {
  const [row] = await tx
    .select()
    .from(researchConsents)
    .where(and(eq(researchConsents.id, consentId), eq(researchConsents.patientId, patientId), inScope(researchConsents.siteId, scope)))
    .for("update");
  return row ?? null;
}

export async function markConsentWithdrawn(tx: Tx, consentId: string, withdrawnOn: string, by: string): Promise<void> {
  await tx.update(researchConsents).set({ withdrawnOn, withdrawnBy: by }).where(eq(researchConsents.id, consentId));
}

/** A patient's consents, newest first, with the study's code and title. */
export function consentsOfPatient(scope: SiteScope, patientId: string) {
  return db
    .select({
      id: researchConsents.id, studyId: researchConsents.studyId, studyCode: studies.code, studyTitle: studies.title,
      consentedOn: researchConsents.consentedOn, formVersion: researchConsents.formVersion, withdrawnOn: researchConsents.withdrawnOn,
    })
    .from(researchConsents)
    .innerJoin(studies, eq(studies.id, researchConsents.studyId))
    .where(and(eq(researchConsents.patientId, patientId), inScope(researchConsents.siteId, scope)))
    .orderBy(asc(studies.code), asc(researchConsents.consentedOn));
}

/** Studies running at a site (to record a consent to). */
export function studiesAtSite(siteId: string) {
  return db
    .select({ id: studies.id, code: studies.code, title: studies.title, consentFormVersion: studies.consentFormVersion })
    .from(studies)
    .innerJoin(studySites, eq(studySites.studyId, studies.id))
    .innerJoin(sites, eq(sites.id, studySites.siteId))
    .where(eq(studySites.siteId, siteId))
    .orderBy(asc(studies.code));
}
