import "server-only";
import { and, asc, eq } from "drizzle-orm";
import { db } from "../client";
import { addenda, users, visits } from "../schema";
import { inScope, type SiteScope } from "./scope";
import { loadVisit } from "./visit-access";
import { refreshTrackStatuses } from "./tracking";
import { AppError } from "@/lib/errors";
import type { Role } from "@/lib/domain/vocab";

/**
 * Signs a draft: only its examiner or an admin. Once signed every write to the visit or its
 * children is refused by lockDraftVisit; later words go in addenda. A signed visit counts as a
 * complete exam for tracking, hence the refresh.
 */
export async function signVisit(scope: SiteScope, signer: { id: string; role: Role }, visitId: string) {
  return db.transaction(async (tx) => {
    const [v] = await tx
      .select({ id: visits.id, patientId: visits.patientId, siteId: visits.siteId, status: visits.status, examinerId: visits.examinerId, version: visits.version })
      .from(visits)
      .where(and(eq(visits.id, visitId), inScope(visits.siteId, scope)))
      .for("update")
      .limit(1);
    if (!v) throw new AppError("not_found");
    if (signer.role !== "admin" && v.examinerId !== signer.id) {
      throw new AppError("forbidden", "Only the examining clinician or an admin can sign this visit.");
    }
    if (v.status === "signed") throw new AppError("conflict", "This visit is already signed. Add an addendum instead.");
    const signedAt = new Date();
    await tx.update(visits).set({ status: "signed", signedAt, signedBy: signer.id, version: v.version + 1, updatedAt: signedAt }).where(eq(visits.id, v.id));
    await refreshTrackStatuses(tx, v.patientId, v.siteId);
    return { id: v.id, patientId: v.patientId, siteId: v.siteId, signedAt, version: v.version + 1 };
  });
}

export async function listAddenda(scope: SiteScope, visitId: string) {
  const v = await loadVisit(db, scope, visitId);
  const rows = await db
    .select({ id: addenda.id, body: addenda.body, authorName: users.displayName, createdAt: addenda.createdAt })
    .from(addenda)
    .innerJoin(users, eq(users.id, addenda.authorId))
    .where(eq(addenda.visitId, v.id))
    .orderBy(asc(addenda.createdAt), asc(addenda.id));
  return { visit: v, addenda: rows };
}

/** Addenda belong to signed visits only: a draft is still edited in place. */
export async function addAddendum(scope: SiteScope, authorId: string, visitId: string, body: string) {
  return db.transaction(async (tx) => {
    const [v] = await tx
      .select({ id: visits.id, patientId: visits.patientId, siteId: visits.siteId, status: visits.status })
      .from(visits)
      .where(and(eq(visits.id, visitId), inScope(visits.siteId, scope)))
      .limit(1);
    if (!v) throw new AppError("not_found");
    if (v.status !== "signed") throw new AppError("conflict", "Addenda are for signed visits; edit this draft directly.");
    const [row] = await tx.insert(addenda).values({ visitId: v.id, siteId: v.siteId, authorId, body }).returning({ id: addenda.id, createdAt: addenda.createdAt });
    return { visit: v, id: row!.id, createdAt: row!.createdAt };
  });
}
