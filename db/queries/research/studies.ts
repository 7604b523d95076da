import "server-only";
import { and, asc, count, eq, sql as dsql } from "drizzle-orm";
import { db } from "../../client";
import { enrolments, sites, studies, studySites, visits } from "../../schema";
import { inScope, type SiteScope } from "../scope";

/** Studies running at the caller's sites, with active and withdrawn enrolment counts (no identities). */
export async function listStudies(scope: SiteScope) {
  return db
    .select({
      id: studies.id,
      code: studies.code,
      title: studies.title,
      startDate: studies.startDate,
      enrolled: count(enrolments.id),
      withdrawn: dsql<number>`count(${enrolments.withdrawnOn})::int`,
    })
    .from(studies)
    .innerJoin(studySites, eq(studySites.studyId, studies.id))
    .leftJoin(enrolments, and(eq(enrolments.studyId, studies.id), eq(enrolments.siteId, studySites.siteId)))
    .where(inScope(studySites.siteId, scope))
    .groupBy(studies.id)
    .orderBy(asc(studies.code));
}

export interface StudyDetail {
  id: string;
  code: string;
  title: string;
  startDate: string;
  consentFormVersion: string;
  sites: { id: string; code: string; name: string }[];
}

/** A study as the caller may see it: only its sites within the caller's scope; none → null (404). */
export async function getStudy(scope: SiteScope, studyId: string): Promise<StudyDetail | null> {
  const [study] = await db
    .select({ id: studies.id, code: studies.code, title: studies.title, startDate: studies.startDate, consentFormVersion: studies.consentFormVersion })
    .from(studies)
    .where(eq(studies.id, studyId));
  if (!study) return null;
  const siteRows = await db
    .select({ id: sites.id, code: sites.code, name: sites.name })
    .from(studySites)
    .innerJoin(sites, eq(sites.id, studySites.siteId))
    .where(and(eq(studySites.studyId, studyId), inScope(studySites.siteId, scope)))
    .orderBy(asc(sites.code));
  if (siteRows.length === 0) return null;
  return { ...study, sites: siteRows };
}

export interface EnrolmentRow {
  id: string;
  studySubjectId: string;
  siteCode: string;
  consentDate: string;
  withdrawnOn: string | null;
  signedVisits: number;
}

/** Enrolments at the caller's sites, by study ID only: no name, MRN or contact detail is selected. */
export async function listEnrolments(scope: SiteScope, studyId: string): Promise<EnrolmentRow[]> {
  return db
    .select({
      id: enrolments.id,
      studySubjectId: enrolments.studySubjectId,
      siteCode: sites.code,
      consentDate: enrolments.consentDate,
      withdrawnOn: enrolments.withdrawnOn,
      // The exports' rule (export-scope.ts, vis): signed visits at the enrolling site, before any withdrawal.
      signedVisits: dsql<number>`(select count(*)::int from ${visits} where ${visits.patientId} = ${enrolments.patientId} and ${visits.siteId} = ${enrolments.siteId} and ${visits.status} = 'signed' and (${enrolments.withdrawnOn} is null or ${visits.visitDate} < ${enrolments.withdrawnOn}))`,
    })
    .from(enrolments)
    .innerJoin(sites, eq(sites.id, enrolments.siteId))
    .where(and(eq(enrolments.studyId, studyId), inScope(enrolments.siteId, scope)))
    .orderBy(asc(enrolments.studySubjectId));
}

export async function getEnrolment(scope: SiteScope, studyId: string, enrolmentId: string) {
  const [row] = await db
    .select({ id: enrolments.id, siteId: enrolments.siteId, patientId: enrolments.patientId, consentDate: enrolments.consentDate, withdrawnOn: enrolments.withdrawnOn, studySubjectId: enrolments.studySubjectId })
    .from(enrolments)
    .where(and(eq(enrolments.id, enrolmentId), eq(enrolments.studyId, studyId), inScope(enrolments.siteId, scope)));
  return row ?? null;
}

/** Finds an enrolment by study subject ID (the nurse's handle on a patient). */
export async function findEnrolmentBySubject(scope: SiteScope, studyId: string, studySubjectId: string) {
  const [row] = await db
    .select({ id: enrolments.id, siteId: enrolments.siteId, patientId: enrolments.patientId, consentDate: enrolments.consentDate, withdrawnOn: enrolments.withdrawnOn, studySubjectId: enrolments.studySubjectId })
    .from(enrolments)
    .where(and(eq(enrolments.studyId, studyId), eq(enrolments.studySubjectId, studySubjectId), inScope(enrolments.siteId, scope)));
  return row ?? null;
}

export async function withdrawEnrolment(enrolmentId: string, withdrawnOn: string): Promise<void> {
  await db.update(enrolments).set({ withdrawnOn }).where(eq(enrolments.id, enrolmentId));
}
