import "server-only";
import { and, eq, isNull } from "drizzle-orm";
import { db } from "../client";
import { adjudications, lesionTracks, patients, reviews, users, userSites, visits } from "../schema";
import { inScope, type SiteScope } from "./scope";
import { recordAudit } from "./audit-write";
import { AppError } from "@/lib/errors";
import type { AdjudicationInput } from "@/lib/validation/tracking";
import { notifyReviewRequested } from "@/lib/mail/notifications";

export async function requestReview(scope: SiteScope, patientId: string, input: { visitId: string; comparedVisitId?: string | null; reviewerId: string }, ip: string) {
  return db.transaction(async (tx) => {
    const [p] = await tx.select({ id: patients.id, siteId: patients.siteId }).from(patients).where(and(eq(patients.id, patientId), inScope(patients.siteId, scope)));
    if (!p) throw new AppError("not_found");
    for (const [field, id] of [["visitId", input.visitId], ["comparedVisitId", input.comparedVisitId]] as const) {
      if (!id) continue;
      const [v] = await tx.select({ id: visits.id }).from(visits).where(and(eq(visits.id, id), eq(visits.patientId, p.id)));
      if (!v) throw new AppError("invalid", undefined, { [field]: ["That visit is not this patient's."] });
    }
    const [reviewer] = await tx.select({ id: users.id }).from(users).innerJoin(userSites, eq(userSites.userId, users.id))
      .where(and(eq(users.id, input.reviewerId), eq(users.role, "reviewer"), eq(users.active, true), eq(userSites.siteId, p.siteId)));
    if (!reviewer) throw new AppError("invalid", undefined, { reviewerId: ["Choose an active reviewer of this site."] });
    const [r] = await tx.insert(reviews).values({ patientId: p.id, siteId: p.siteId, visitId: input.visitId, comparedVisitId: input.comparedVisitId ?? null, reviewerId: reviewer.id, requestedBy: scope.userId }).returning();
    // The reviewer hears of it by e-mail (a link only), unless they asked for it themselves.
    if (reviewer.id !== scope.userId) await notifyReviewRequested(tx, r!.id, { path: `/patients/${p.id}/compare` });
    await recordAudit({ userId: scope.userId, siteId: p.siteId, patientId: p.id, action: "review.request", entityType: "review", entityId: r!.id, ip, detail: { ...input } }, tx);
    return r!;
  });
}

async function loadReviewFor(scope: SiteScope, reviewId: string) {
  const [r] = await db.select().from(reviews).where(and(eq(reviews.id, reviewId), inScope(reviews.siteId, scope)));
  if (!r) throw new AppError("not_found");
  return r;
}

export async function getReview(scope: SiteScope, reviewId: string) {
  const r = await loadReviewFor(scope, reviewId);
  const rows = await db.select().from(adjudications).where(eq(adjudications.reviewId, r.id));
  return { review: r, adjudications: rows };
}

export async function adjudicate(scope: SiteScope, reviewId: string, input: AdjudicationInput, ip: string) {
  return db.transaction(async (tx) => {
    const [r] = await tx.select().from(reviews).where(and(eq(reviews.id, reviewId), inScope(reviews.siteId, scope))).for("update");
    if (!r) throw new AppError("not_found");
    if (r.status === "signed_off") throw new AppError("locked", "This review is signed off; open a new review to change it.");
    if (r.reviewerId && r.reviewerId !== scope.userId) throw new AppError("forbidden", "This review is assigned to another reviewer.");
    const [t] = await tx.select({ id: lesionTracks.id }).from(lesionTracks).where(and(eq(lesionTracks.id, input.trackId), eq(lesionTracks.patientId, r.patientId)));
    if (!t) throw new AppError("invalid", undefined, { trackId: ["That track is not this patient's."] });
    const values = { verdict: input.verdict, proposedStatus: input.verdict === "agree" ? null : (input.proposedStatus ?? null), comment: input.comment ?? null, resolvedAt: null, resolvedBy: null };
    const [a] = await tx.insert(adjudications).values({ reviewId: r.id, siteId: r.siteId, trackId: input.trackId, ...values })
      .onConflictDoUpdate({ target: [adjudications.reviewId, adjudications.trackId], set: values }).returning();
    await tx.update(reviews).set({ status: "in_progress", reviewerId: r.reviewerId ?? scope.userId }).where(eq(reviews.id, r.id));
    await recordAudit({ userId: scope.userId, siteId: r.siteId, patientId: r.patientId, action: "review.adjudicate", entityType: "adjudication", entityId: a!.id, ip, detail: { ...input } }, tx);
    return a!;
  });
}

export async function signOffReview(scope: SiteScope, reviewId: string, ip: string) {
  const r = await loadReviewFor(scope, reviewId);
  if (r.status === "signed_off") throw new AppError("conflict", "This review is already signed off.");
  if (r.reviewerId && r.reviewerId !== scope.userId) throw new AppError("forbidden", "This review is assigned to another reviewer.");
  await db.update(reviews).set({ status: "signed_off", signedOffAt: new Date(), reviewerId: scope.userId }).where(eq(reviews.id, r.id));
  await recordAudit({ userId: scope.userId, siteId: r.siteId, patientId: r.patientId, action: "review.sign_off", entityType: "review", entityId: r.id, ip });
  return { ok: true };
}

/** The clinician acknowledges a disagreement after acting on it. */
export async function resolveAdjudication(scope: SiteScope, adjudicationId: string, ip: string) {
  const [a] = await db.select({ id: adjudications.id, siteId: adjudications.siteId, reviewId: adjudications.reviewId }).from(adjudications).where(and(eq(adjudications.id, adjudicationId), inScope(adjudications.siteId, scope)));
  if (!a) throw new AppError("not_found");
  await db.update(adjudications).set({ resolvedAt: new Date(), resolvedBy: scope.userId }).where(eq(adjudications.id, a.id));
  await recordAudit({ userId: scope.userId, siteId: a.siteId, action: "review.resolve", entityType: "adjudication", entityId: a.id, ip });
  return { ok: true };
}

/** Open disagreements on a patient, for the patient page. */
export async function listOpenDisagreements(scope: SiteScope, patientId: string) {
  // Another site's patient (or none) is not found, not an empty list: the answer must not
  // differ from the one for a record that does not exist, and must not read as "no reviews".
  const [p] = await db.select({ id: patients.id }).from(patients).where(and(eq(patients.id, patientId), inScope(patients.siteId, scope)));
  if (!p) throw new AppError("not_found");
  return db
    .select({ id: adjudications.id, trackLabel: lesionTracks.label, proposedStatus: adjudications.proposedStatus, comment: adjudications.comment, reviewer: users.displayName, createdAt: adjudications.createdAt, reviewId: reviews.id, visitId: reviews.visitId, comparedVisitId: reviews.comparedVisitId })
    .from(adjudications)
    .innerJoin(reviews, eq(reviews.id, adjudications.reviewId))
    .innerJoin(lesionTracks, eq(lesionTracks.id, adjudications.trackId))
    .leftJoin(users, eq(users.id, reviews.reviewerId))
    .where(and(eq(reviews.patientId, patientId), eq(adjudications.verdict, "disagree"), isNull(adjudications.resolvedAt), inScope(adjudications.siteId, scope)));
}

export async function listReviewersForSite(siteId: string) {
  return db.select({ id: users.id, displayName: users.displayName }).from(users).innerJoin(userSites, eq(userSites.userId, users.id))
    .where(and(eq(userSites.siteId, siteId), eq(users.role, "reviewer"), eq(users.active, true)));
}
