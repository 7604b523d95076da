import "server-only";
import { db } from "@/db/client";
import {
  activeReviewerOfSite, adjudicationForUpdate, insertReview, loadReviewFor, markAdjudicationResolved, patientSiteInScope, reviewForUpdate,
  setReviewInProgress, setReviewSignedOff, trackIsPatients, upsertAdjudication, visitIsPatients,
} from "@/db/queries/reviews";
import { recordAudit } from "@/db/queries/audit-write";
import type { SiteScope } from "@/db/queries/scope";
import { AppError } from "@/lib/errors";
import type { AdjudicationInput, ResolveDisagreementInput } from "@/lib/validation/tracking";
import { notifyReviewRequested } from "./notifications";

export async function requestReview(scope: SiteScope, patientId: string, input: { visitId: string; comparedVisitId?: string | null; reviewerId: string }, ip: string) {
  return db.transaction(async (tx) => {
    const p = await patientSiteInScope(tx, scope, patientId);
    if (!p) throw new AppError("not_found");
    for (const [field, id] of [["visitId", input.visitId], ["comparedVisitId", input.comparedVisitId]] as const) {
      if (id && !(await visitIsPatients(tx, id, p.id))) throw new AppError("invalid", undefined, { [field]: ["That visit is not this patient's."] });
    }
    const reviewer = await activeReviewerOfSite(tx, input.reviewerId, p.siteId);
    if (!reviewer) throw new AppError("invalid", undefined, { reviewerId: ["Choose an active reviewer of this site."] });
    const r = await insertReview(tx, { patientId: p.id, siteId: p.siteId, visitId: input.visitId, comparedVisitId: input.comparedVisitId ?? null, reviewerId: reviewer.id, requestedBy: scope.userId });
    // The reviewer hears of it by e-mail (a link only), unless they asked for it themselves. The
    // link names the exact pair, so the reviewer lands on this review and not on a new one.
    if (reviewer.id !== scope.userId) await notifyReviewRequested(tx, r.id, { path: reviewPairPath(p.id, input.visitId, input.comparedVisitId) });
    await recordAudit({ userId: scope.userId, siteId: p.siteId, patientId: p.id, action: "review.request", entityType: "review", entityId: r.id, ip, detail: { ...input } }, tx);
    return r;
  });
}

/** The compare page opened on the reviewed pair: a = the earlier visit, b = the visit reviewed. */
export function reviewPairPath(patientId: string, visitId: string, comparedVisitId?: string | null): string {
  return `/patients/${patientId}/compare?${comparedVisitId ? `a=${comparedVisitId}&` : ""}b=${visitId}`;
}

export async function adjudicate(scope: SiteScope, reviewId: string, input: AdjudicationInput, ip: string) {
  return db.transaction(async (tx) => {
    const r = await reviewForUpdate(tx, scope, reviewId);
    if (!r) throw new AppError("not_found");
    if (r.status === "signed_off") throw new AppError("locked", "This review is signed off; open a new review to change it.");
    if (r.reviewerId && r.reviewerId !== scope.userId) throw new AppError("forbidden", "This review is assigned to another reviewer.");
    if (!(await trackIsPatients(tx, input.trackId, r.patientId))) throw new AppError("invalid", undefined, { trackId: ["That track is not this patient's."] });
    const values = { verdict: input.verdict, proposedStatus: input.verdict === "disagree" ? (input.proposedStatus ?? null) : null, comment: input.comment ?? null, resolvedAt: null, resolvedBy: null, outcome: null, outcomeNote: null };
    const a = await upsertAdjudication(tx, { reviewId: r.id, siteId: r.siteId, trackId: input.trackId }, values);
    await setReviewInProgress(tx, r.id, r.reviewerId ?? scope.userId);
    await recordAudit({ userId: scope.userId, siteId: r.siteId, patientId: r.patientId, action: "review.adjudicate", entityType: "adjudication", entityId: a.id, ip, detail: { ...input } }, tx);
    return a;
  });
}

export async function signOffReview(scope: SiteScope, reviewId: string, ip: string) {
  const r = await loadReviewFor(scope, reviewId);
  if (r.status === "signed_off") throw new AppError("conflict", "This review is already signed off.");
  if (r.reviewerId && r.reviewerId !== scope.userId) throw new AppError("forbidden", "This review is assigned to another reviewer.");
  await db.transaction(async (tx) => {
    await setReviewSignedOff(tx, r.id, scope.userId);
    await recordAudit({ userId: scope.userId, siteId: r.siteId, patientId: r.patientId, action: "review.sign_off", entityType: "review", entityId: r.id, ip }, tx);
  });
  return { ok: true };
}

/**
 * The clinician settles a reviewer's disagreement after acting on it, saying which status stands
 * (the reviewer's, the record having been changed to match, or the recorded one) and why.
 */
export async function resolveAdjudication(scope: SiteScope, adjudicationId: string, input: ResolveDisagreementInput, ip: string) {
  return db.transaction(async (tx) => {
    const a = await adjudicationForUpdate(tx, scope, adjudicationId);
    if (!a) throw new AppError("not_found");
    if (a.verdict !== "disagree") throw new AppError("conflict", "Only a disagreement is resolved; this verdict agrees or did not examine.");
    if (a.resolvedAt) throw new AppError("conflict", "This disagreement is already resolved.");
    const outcomeNote = input.note || null;
    const { resolvedAt } = await markAdjudicationResolved(tx, a.id, { resolvedBy: scope.userId, outcome: input.outcome, outcomeNote });
    await recordAudit({
      userId: scope.userId, siteId: a.siteId, patientId: a.patientId, action: "review.resolve", entityType: "adjudication", entityId: a.id, ip,
      detail: { outcome: input.outcome, note: outcomeNote, proposedStatus: a.proposedStatus },
    }, tx);
    return { id: a.id, outcome: input.outcome, outcomeNote, resolvedAt, resolvedBy: scope.userId };
  });
}
