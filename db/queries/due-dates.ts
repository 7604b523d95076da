import "server-only";
// Statements behind due dates: what the rules read of each patient's latest visit, the clinician's
// own date, and the sites' rule tables. lib/server/due-dates.ts works the dates out.
import { and, desc, eq, inArray, isNotNull, sql, type SQL } from "drizzle-orm";
import { db, type Tx } from "../client";
import { biopsies, lesions, patients, sites, trackStatuses, treatments, users, visits } from "../schema";
import { inScope, type SiteScope } from "./scope";

/** Which patients: one in scope, those of the scope (optionally one site or clinician), or everyone. */
export interface DueFilter {
  scope?: SiteScope;
  patientId?: string;
  /** Several patients (a page of the patient list). */
  patientIds?: readonly string[];
  siteId?: string;
  clinicianId?: string;
  /** Only patients still followed (not inactive or deceased): the worklist and the reminders. */
  activeOnly?: boolean;
}

function whereOf(f: DueFilter): SQL | undefined {
  return and(
    f.scope ? inScope(patients.siteId, f.scope) : undefined,
    f.patientId ? eq(patients.id, f.patientId) : undefined,
    f.patientIds ? (f.patientIds.length ? inArray(patients.id, [...f.patientIds]) : sql`false`) : undefined,
    f.siteId ? eq(patients.siteId, f.siteId) : undefined,
    f.clinicianId ? eq(patients.clinicianId, f.clinicianId) : undefined,
    f.activeOnly ? eq(patients.status, "active") : undefined,
  );
}

/** Everything the due-date rules read for the patients of the filter who have a visit. */
export async function readDueInputs(f: DueFilter) {
  const people = await db
    .select({
      patientId: patients.id, siteId: patients.siteId, siteName: sites.name, siteRules: sites.followupRules, mrn: patients.mrn,
      familyName: patients.familyName, givenName: patients.givenName, clinicianId: patients.clinicianId, clinicianName: users.displayName,
      override: patients.nextDueOverride, overrideReason: patients.nextDueOverrideReason, consentEmail: patients.consentEmail, contactEmail: patients.contactEmail,
    })
    .from(patients)
    .innerJoin(sites, eq(sites.id, patients.siteId))
    .leftJoin(users, eq(users.id, patients.clinicianId))
    .where(whereOf(f));
  const ids = people.map((p) => p.patientId);
  const latest = ids.length
    ? await db
        .selectDistinctOn([visits.patientId], { patientId: visits.patientId, visitId: visits.id, visitDate: visits.visitDate, cytology: visits.cytology })
        .from(visits)
        .where(inArray(visits.patientId, ids))
        .orderBy(visits.patientId, desc(visits.visitDate), desc(visits.createdAt))
    : [];
  const latestIds = latest.map((v) => v.visitId);
  if (latestIds.length === 0) return { people, latest, lesions: [], histologies: [], trackGrades: [], treatments: [] };
  const [lesionRows, histRows, trackRows, treatmentRows] = await Promise.all([
    db.select({ id: lesions.id, visitId: lesions.visitId, grade: lesions.grade }).from(lesions).where(inArray(lesions.visitId, latestIds)),
    db.select({ lesionId: biopsies.lesionId, histology: biopsies.histology }).from(biopsies).innerJoin(visits, eq(visits.id, biopsies.visitId)).where(and(inArray(visits.patientId, ids), isNotNull(biopsies.histology))),
    db.select({ visitId: trackStatuses.visitId, grade: trackStatuses.effectiveGrade }).from(trackStatuses).where(and(inArray(trackStatuses.visitId, latestIds), isNotNull(trackStatuses.effectiveGrade))),
    db.select({ patientId: visits.patientId, visitDate: visits.visitDate, lesionId: treatments.lesionId, grade: lesions.grade })
      .from(treatments).innerJoin(visits, eq(visits.id, treatments.visitId)).leftJoin(lesions, eq(lesions.id, treatments.lesionId))
      .where(inArray(visits.patientId, ids)),
  ]);
  return { people, latest, lesions: lesionRows, histologies: histRows, trackGrades: trackRows, treatments: treatmentRows };
}

/** The patient's own-date fields, locked, when in scope. */
export async function patientOverrideForUpdate(tx: Tx, scope: SiteScope, patientId: string) {
  const [p] = await tx
    .select({ id: patients.id, siteId: patients.siteId, date: patients.nextDueOverride, reason: patients.nextDueOverrideReason })
    .from(patients)
    .where(and(eq(patients.id, patientId), inScope(patients.siteId, scope)))
    .for("update")
    .limit(1);
  return p ?? null;
}

export async function setPatientOverride(tx: Tx, patientId: string, date: string | null, reason: string | null): Promise<void> {
  await tx.update(patients).set({ nextDueOverride: date, nextDueOverrideReason: reason }).where(eq(patients.id, patientId));
}

export function siteRuleRows(siteIds: string[]) {
  return db.select({ id: sites.id, code: sites.code, name: sites.name, rules: sites.followupRules }).from(sites).where(inArray(sites.id, siteIds)).orderBy(sites.name);
}

export async function siteRulesForUpdate(tx: Tx, siteId: string) {
  const [site] = await tx.select({ id: sites.id, rules: sites.followupRules }).from(sites).where(eq(sites.id, siteId)).for("update").limit(1);
  return site ?? null;
}

export async function setSiteRules(tx: Tx, siteId: string, rules: unknown): Promise<void> {
  await tx.update(sites).set({ followupRules: rules }).where(eq(sites.id, siteId));
}
