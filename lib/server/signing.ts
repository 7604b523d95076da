import "server-only";
import { db } from "@/db/client";
import { insertAddendum, listAddenda, markVisitSigned, trackDecisionsAtVisit, visitForAddendum, visitForSigning } from "@/db/queries/signing";
import { lockPatientStatusesOfVisit } from "@/db/queries/patient-lock";
import { recordAudit } from "@/db/queries/audit-write";
import type { SiteScope } from "@/db/queries/scope";
import type { Role } from "@/lib/domain/vocab";
import { AppError } from "@/lib/errors";
import { undecidedMessage, undecidedTracks } from "@/lib/tracking";
import { refreshTrackStatuses } from "./track-statuses";

/**
 * Signs a draft: only its examiner or an admin. Once signed every write to the visit or its
 * children is refused by lockDraftVisit; later words go in addenda. A signed visit counts as a
 * complete exam for tracking, hence the refresh: so every earlier track must have a decision here
 * (found, not found, treated or not examined) first. An undecided one would be read as not found
 * and could count as clear; signing is refused (409) naming each of them.
 */
export async function signVisit(scope: SiteScope, signer: { id: string; role: Role }, visitId: string, ip: string) {
  return db.transaction(async (tx) => {
    const [, v] = await Promise.all([lockPatientStatusesOfVisit(tx, scope, visitId), visitForSigning(tx, scope, visitId)]);
    if (!v) throw new AppError("not_found");
    if (signer.role !== "admin" && v.examinerId !== signer.id) {
      throw new AppError("forbidden", "Only the examining clinician or an admin can sign this visit.");
    }
    if (v.status === "signed") throw new AppError("conflict", "This visit is already signed. Add an addendum instead.");
    const decisions = await trackDecisionsAtVisit(tx, v);
    const undecided = undecidedTracks(decisions.earlier, decisions.foundHere, decisions.checks);
    if (undecided.length) {
      throw new AppError(
        "conflict",
        undecidedMessage(undecided.map((t) => t.label)),
        Object.fromEntries(undecided.map((t) => [`track.${t.trackId}`, [`${t.label} is still to look for: found, not found or not examined?`]])),
      );
    }
    const signedAt = new Date();
    const version = v.version + 1;
    await markVisitSigned(tx, v.id, signer.id, signedAt, version);
    await refreshTrackStatuses(tx, v.patientId, v.siteId);
    await recordAudit({ userId: signer.id, siteId: v.siteId, patientId: v.patientId, action: "visit.sign", entityType: "visit", entityId: v.id, ip, detail: { version } }, tx);
    return { id: v.id, patientId: v.patientId, siteId: v.siteId, signedAt, version };
  });
}

/** A visit's addenda, the read audited. */
export async function readAddenda(scope: SiteScope, visitId: string, ip: string) {
  const { visit, addenda } = await listAddenda(scope, visitId);
  await recordAudit({ userId: scope.userId, siteId: visit.siteId, patientId: visit.patientId, action: "visit.addenda.read", entityType: "visit", entityId: visit.id, ip });
  return addenda;
}

/** Addenda belong to signed visits only: a draft is still edited in place. */
export async function addAddendum(scope: SiteScope, authorId: string, visitId: string, body: string, ip: string) {
  return db.transaction(async (tx) => {
    const v = await visitForAddendum(tx, scope, visitId);
    if (!v) throw new AppError("not_found");
    if (v.status !== "signed") throw new AppError("conflict", "Addenda are for signed visits; edit this draft directly.");
    const row = await insertAddendum(tx, { visitId: v.id, siteId: v.siteId, authorId, body });
    await recordAudit({ userId: authorId, siteId: v.siteId, patientId: v.patientId, action: "addendum.create", entityType: "addendum", entityId: row.id, ip }, tx);
    return { visit: v, id: row.id, createdAt: row.createdAt };
  });
}
