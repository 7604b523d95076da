import "server-only";
import { and, asc, count, eq, sql } from "drizzle-orm";
import { db } from "../client";
import { enrolments, studies, studySites } from "../schema";
import { inScope, type SiteScope } from "./scope";

/** Studies running at the caller's sites, with active and withdrawn enrolment counts (no identities). */
export async function listStudies(scope: SiteScope) {
  return db
    .select({
      id: studies.id,
      code: studies.code,
      title: studies.title,
      startDate: studies.startDate,
      enrolled: count(enrolments.id),
      withdrawn: sql<number>`count(${enrolments.withdrawnOn})::int`,
    })
    .from(studies)
    .innerJoin(studySites, eq(studySites.studyId, studies.id))
    .leftJoin(enrolments, and(eq(enrolments.studyId, studies.id), eq(enrolments.siteId, studySites.siteId)))
    .where(inScope(studySites.siteId, scope))
    .groupBy(studies.id)
    .orderBy(asc(studies.code));
}
