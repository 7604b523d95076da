import "server-only";
import { and, asc, count, desc, eq, ilike, or } from "drizzle-orm";
import { db } from "../client";
import { patients, users, visits } from "../schema";
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
