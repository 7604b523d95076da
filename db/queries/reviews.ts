import "server-only";
import { and, asc, desc, eq, inArray, sql as dsql } from "drizzle-orm";
import type { DisagreementOutcome } from "@/lib/domain/vocab";
import { alias } from "drizzle-orm/pg-core";
import { db, type Tx } from "../client";
import { adjudications, lesionTracks, patients, reviews, users, userSites, visits } from "../schema";
import { inScope, type SiteScope } from "./scope";
import { AppError } from "@/lib/errors";

export async function loadReviewFor(scope: SiteScope, reviewId: string) {
  const [r] = await db.select().from(reviews).where(and(eq(reviews.id, reviewId), inScope(reviews.siteId, scope)));
  if (!r) throw new AppError("not_found");
  return r;
}

export async function getReview(scope: SiteScope, reviewId: string) {
  const r = await loadReviewFor(scope, reviewId);
  const rows = await db.select().from(adjudications).where(eq(adjudications.reviewId, r.id));
  return { review: r, adjudications: rows };
}

export async function patientSiteInScope(tx: Tx, scope: SiteScope, patientId: string) {
  const [p] = await tx.select({ id: patients.id, siteId: patients.siteId }).from(patients).where(and(eq(patients.id, patientId), inScope(patients.siteId, scope)));
  return p ?? null;
}

export async function visitIsPatients(tx: Tx, visitId: string, patientId: string): Promise<boolean> {
  const [v] = await tx.select({ id: visits.id }).from(visits).where(and(eq(visits.id, visitId), eq(visits.patientId, patientId)));
  return Boolean(v);
}

/** The user, when an active reviewer of the site. */
export async function activeReviewerOfSite(tx: Tx, userId: string, siteId: string) {
  const [reviewer] = await tx.select({ id: users.id }).from(users).innerJoin(userSites, eq(userSites.userId, users.id))
    .where(and(eq(users.id, userId), eq(users.role, "reviewer"), eq(users.active, true), eq(userSites.siteId, siteId)));
  return reviewer ?? null;
}

export async function insertReview(tx: Tx, values: typeof reviews.$inferInsert) {
  const [r] = await tx.insert(reviews).values(values).returning();
  return r!;
}

export async function reviewForUpdate(tx: Tx, scope: SiteScope, reviewId: string) {
  const [r] = await tx.select().from(reviews).where(and(eq(reviews.id, reviewId), inScope(reviews.siteId, scope))).for("update");
  return r ?? null;
}

export async function trackIsPatients(tx: Tx, trackId: string, patientId: string): Promise<boolean> {
  const [t] = await tx.select({ id: lesionTracks.id }).from(lesionTracks).where(and(eq(lesionTracks.id, trackId), eq(lesionTracks.patientId, patientId)));
  return Boolean(t);
}

type Verdict = Pick<typeof adjudications.$inferInsert, "verdict" | "proposedStatus" | "comment" | "resolvedAt" | "resolvedBy" | "outcome" | "outcomeNote">;
export async function upsertAdjudication(tx: Tx, key: { reviewId: string; siteId: string; trackId: string }, values: Verdict) {
  const [a] = await tx.insert(adjudications).values({ ...key, ...values })
    .onConflictDoUpdate({ target: [adjudications.reviewId, adjudications.trackId], set: values }).returning();
  return a!;
}

export async function setReviewInProgress(tx: Tx, reviewId: string, reviewerId: string): Promise<void> {
  await tx.update(reviews).set({ status: "in_progress", reviewerId }).where(eq(reviews.id, reviewId));
}

export async function setReviewSignedOff(tx: Tx, reviewId: string, reviewerId: string): Promise<void> {
  await tx.update(reviews).set({ status: "signed_off", signedOffAt: new Date(), reviewerId }).where(eq(reviews.id, reviewId));
}

/** The adjudication in scope, locked for the resolution, with its patient and what it said. */
export async function adjudicationForUpdate(tx: Tx, scope: SiteScope, adjudicationId: string) {
  const [a] = await tx
    .select({ id: adjudications.id, siteId: adjudications.siteId, reviewId: adjudications.reviewId, patientId: reviews.patientId, verdict: adjudications.verdict, proposedStatus: adjudications.proposedStatus, resolvedAt: adjudications.resolvedAt })
    .from(adjudications)
    .innerJoin(reviews, eq(reviews.id, adjudications.reviewId))
    .where(and(eq(adjudications.id, adjudicationId), inScope(adjudications.siteId, scope)))
    .for("update", { of: adjudications });
  return a ?? null;
}

export async function markAdjudicationResolved(tx: Tx, adjudicationId: string, values: { resolvedBy: string; outcome: DisagreementOutcome; outcomeNote: string | null }) {
  const [a] = await tx.update(adjudications).set({ resolvedAt: new Date(), ...values }).where(eq(adjudications.id, adjudicationId)).returning({ resolvedAt: adjudications.resolvedAt });
  return a!;
}

/**
 * A patient's reviewer disagreements, for the patient and compare pages: open ones, and resolved
 * ones with which status stood, who settled it and when (newest first).
 */
export async function listDisagreements(scope: SiteScope, patientId: string) {
  // Another site's patient (or none) is not found, not an empty list: the answer must not
  // differ from the one for a record that does not exist, and must not read as "no reviews".
  const [p] = await db.select({ id: patients.id }).from(patients).where(and(eq(patients.id, patientId), inScope(patients.siteId, scope)));
  if (!p) throw new AppError("not_found");
  const resolver = alias(users, "resolver");
  return db
    .select({
      id: adjudications.id, trackLabel: lesionTracks.label, proposedStatus: adjudications.proposedStatus, comment: adjudications.comment, reviewer: users.displayName,
      createdAt: adjudications.createdAt, reviewId: reviews.id, visitId: reviews.visitId, comparedVisitId: reviews.comparedVisitId,
      resolvedAt: adjudications.resolvedAt, resolvedBy: resolver.displayName, outcome: adjudications.outcome, outcomeNote: adjudications.outcomeNote,
    })
    .from(adjudications)
    .innerJoin(reviews, eq(reviews.id, adjudications.reviewId))
    .innerJoin(lesionTracks, eq(lesionTracks.id, adjudications.trackId))
    .leftJoin(users, eq(users.id, reviews.reviewerId))
    .leftJoin(resolver, eq(resolver.id, adjudications.resolvedBy))
    .where(and(eq(reviews.patientId, patientId), eq(adjudications.verdict, "disagree"), inScope(adjudications.siteId, scope)))
    .orderBy(desc(adjudications.resolvedAt), asc(adjudications.createdAt));
}

export async function listReviewersForSite(siteId: string) {
  return db.select({ id: users.id, displayName: users.displayName }).from(users).innerJoin(userSites, eq(userSites.userId, users.id))
    .where(and(eq(userSites.siteId, siteId), eq(users.role, "reviewer"), eq(users.active, true)));
}

/** The caller's reviews still to do (requested or in progress), oldest request first, in scope. */
export async function listOpenReviewsForReviewer(scope: SiteScope) {
  const compared = alias(visits, "compared");
  const requester = alias(users, "requester");
  return db
    .select({
      id: reviews.id, status: reviews.status, requestedAt: reviews.createdAt, patientId: reviews.patientId, visitId: reviews.visitId,
      comparedVisitId: reviews.comparedVisitId, mrn: patients.mrn, familyName: patients.familyName, givenName: patients.givenName,
      visitDate: visits.visitDate, comparedVisitDate: compared.visitDate, requestedBy: requester.displayName,
      verdicts: dsql<number>`(select count(*)::int from ${adjudications} where ${adjudications.reviewId} = ${reviews.id})`,
    })
    .from(reviews)
    .innerJoin(patients, eq(patients.id, reviews.patientId))
    .innerJoin(visits, eq(visits.id, reviews.visitId))
    .leftJoin(compared, eq(compared.id, reviews.comparedVisitId))
    .leftJoin(requester, eq(requester.id, reviews.requestedBy))
    .where(and(eq(reviews.reviewerId, scope.userId), inArray(reviews.status, ["requested", "in_progress"]), inScope(reviews.siteId, scope)))
    .orderBy(asc(reviews.createdAt));
}
