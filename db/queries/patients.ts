import "server-only";
import { and, asc, count, desc, eq, ilike, inArray, ne, or, sql } from "drizzle-orm";
import { db, type Tx } from "../client";
import { patients, users, userSites, visits } from "../schema";
import { inScope, type SiteScope } from "./scope";

export const PAGE_SIZE = 20;

export async function listPatients(scope: SiteScope, opts: { q?: string; page?: number }) {
  const page = Math.max(1, opts.page ?? 1);
  const q = opts.q?.trim();
  const where = and(
    inScope(patients.siteId, scope),
    q
      ? or(
          ilike(patients.familyName, `%${escapeLike(q)}%`),
          ilike(patients.givenName, `%${escapeLike(q)}%`),
          ilike(patients.mrn, `%${escapeLike(q)}%`),
        )
      : undefined,
  );
  const [rows, [{ total }]] = await Promise.all([
    db
      .select({
        id: patients.id,
        mrn: patients.mrn,
        familyName: patients.familyName,
        givenName: patients.givenName,
        dateOfBirth: patients.dateOfBirth,
        siteId: patients.siteId,
      })
      .from(patients)
      .where(where)
      .orderBy(asc(patients.familyName), asc(patients.givenName), asc(patients.id))
      .limit(PAGE_SIZE)
      .offset((page - 1) * PAGE_SIZE),
    db.select({ total: count() }).from(patients).where(where),
  ]);
  return { rows, total, page, pageCount: Math.max(1, Math.ceil(total / PAGE_SIZE)) };
}

function escapeLike(s: string): string {
  return s.replace(/[\\%_]/g, (c) => `\\${c}`);
}

export async function getPatient(scope: SiteScope, patientId: string) {
  const [row] = await db
    .select({
      id: patients.id,
      siteId: patients.siteId,
      mrn: patients.mrn,
      familyName: patients.familyName,
      givenName: patients.givenName,
      dateOfBirth: patients.dateOfBirth,
      sexAtBirth: patients.sexAtBirth,
      genderIdentity: patients.genderIdentity,
      hivStatus: patients.hivStatus,
      riskGroups: patients.riskGroups,
      riskDate: patients.riskDate,
      consentEmail: patients.consentEmail,
      consentResearch: patients.consentResearch,
      postalCode: patients.zip,
      contactEmail: patients.contactEmail,
      clinicianId: patients.clinicianId,
      status: patients.status,
      version: patients.version,
    })
    .from(patients)
    .where(and(eq(patients.id, patientId), inScope(patients.siteId, scope)))
    .limit(1);
  return row ?? null;
}

export async function listVisitsForPatient(scope: SiteScope, patientId: string) {
  return db
    .select({
      id: visits.id,
      visitDate: visits.visitDate,
      status: visits.status,
      patientPosition: visits.patientPosition,
      examinerName: users.displayName,
    })
    .from(visits)
    .innerJoin(users, eq(users.id, visits.examinerId))
    .where(and(eq(visits.patientId, patientId), inScope(visits.siteId, scope)))
    .orderBy(desc(visits.visitDate));
}

// Registration and edits (lib/server/patients.ts decides; these only read and write).

const editable = {
  id: patients.id, siteId: patients.siteId, mrn: patients.mrn, familyName: patients.familyName, givenName: patients.givenName,
  dateOfBirth: patients.dateOfBirth, sexAtBirth: patients.sexAtBirth, hivStatus: patients.hivStatus, riskGroups: patients.riskGroups,
  riskDate: patients.riskDate, postalCode: patients.zip, contactEmail: patients.contactEmail, clinicianId: patients.clinicianId,
  status: patients.status, version: patients.version,
};
export type EditablePatient = NonNullable<Awaited<ReturnType<typeof patientForUpdate>>>;
export type PatientValues = Omit<typeof patients.$inferInsert, "id" | "createdAt" | "version">;

/** The patient holding this MRN at the site, if any. */
export async function patientByMrn(tx: Tx, siteId: string, mrn: string, exceptId?: string) {
  const [row] = await tx
    .select({ id: patients.id, familyName: patients.familyName, givenName: patients.givenName })
    .from(patients)
    .where(and(eq(patients.siteId, siteId), eq(patients.mrn, mrn), exceptId ? ne(patients.id, exceptId) : undefined))
    .limit(1);
  return row ?? null;
}

/** Trigram similarity from which a family name counts as a close spelling (pg_trgm's own default is 0.3). */
export const NAME_SIMILARITY = 0.4;

/** Patients at the site born the same day whose family name is the same or close (pg_trgm), closest first. */
export function similarPatients(tx: Tx, siteId: string, familyName: string, dateOfBirth: string, exceptId?: string) {
  const sim = sql<number>`similarity(lower(${patients.familyName}), lower(${familyName}))`;
  return tx
    .select({ id: patients.id, mrn: patients.mrn, familyName: patients.familyName, givenName: patients.givenName, dateOfBirth: patients.dateOfBirth, similarity: sim })
    .from(patients)
    .where(and(eq(patients.siteId, siteId), eq(patients.dateOfBirth, dateOfBirth), exceptId ? ne(patients.id, exceptId) : undefined,
      or(sql`lower(${patients.familyName}) = lower(${familyName})`, sql`${sim} >= ${NAME_SIMILARITY}`)))
    .orderBy(desc(sim), asc(patients.familyName))
    .limit(10);
}

/** True when the user is an active clinician or administrator working at the site. */
export async function isClinicianAtSite(tx: Tx, userId: string, siteId: string): Promise<boolean> {
  const rows = await tx
    .select({ id: users.id })
    .from(users)
    .innerJoin(userSites, and(eq(userSites.userId, users.id), eq(userSites.siteId, siteId)))
    .where(and(eq(users.id, userId), eq(users.active, true), inArray(users.role, ["clinician", "admin"])));
  return rows.length > 0;
}

export async function insertPatient(tx: Tx, values: PatientValues) {
  const [row] = await tx.insert(patients).values(values).returning(editable);
  return row!;
}

/** The patient's editable fields, locked, when in scope. */
export async function patientForUpdate(tx: Tx, scope: SiteScope, patientId: string) {
  const [row] = await tx.select(editable).from(patients).where(and(eq(patients.id, patientId), inScope(patients.siteId, scope))).for("update");
  return row ?? null;
}

export async function updatePatientRow(tx: Tx, patientId: string, set: Partial<PatientValues>, version: number) {
  const [row] = await tx.update(patients).set({ ...set, version }).where(eq(patients.id, patientId)).returning(editable);
  return row!;
}

/** Clinicians and administrators of these sites, one row per site they work at (the form's choices). */
export function cliniciansBySite(siteIds: string[]) {
  if (siteIds.length === 0) return Promise.resolve([]);
  return db
    .select({ id: users.id, displayName: users.displayName, siteId: userSites.siteId })
    .from(users)
    .innerJoin(userSites, eq(userSites.userId, users.id))
    .where(and(inArray(userSites.siteId, siteIds), eq(users.active, true), inArray(users.role, ["clinician", "admin"])))
    .orderBy(asc(users.displayName));
}
