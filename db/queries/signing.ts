import "server-only";
import { and, asc, eq, isNotNull } from "drizzle-orm";
import { db, type Tx } from "../client";
import { addenda, lesions, lesionTracks, trackChecks, users, visits } from "../schema";
import { inScope, type SiteScope } from "./scope";
import { loadVisit } from "./visit-access";
import { earlierThan } from "./track-links";

/** The visit row for signing, locked, when it is in the caller's scope. */
export async function visitForSigning(tx: Tx, scope: SiteScope, visitId: string) {
  const [v] = await tx
    .select({ id: visits.id, patientId: visits.patientId, siteId: visits.siteId, status: visits.status, examinerId: visits.examinerId, version: visits.version, visitDate: visits.visitDate })
    .from(visits)
    .where(and(eq(visits.id, visitId), inScope(visits.siteId, scope)))
    .for("update")
    .limit(1);
  return v ?? null;
}

/**
 * What signing checks about earlier tracks, read inside the signing transaction: every track seen
 * at a visit of the patient dated before this one (as the follow-up list shows them), the tracks
 * this visit's lesions continue, and the marks made here. Sent together.
 */
export async function trackDecisionsAtVisit(tx: Tx, v: { id: string; patientId: string; visitDate: string }) {
  const [earlier, found, checks] = await Promise.all([
    tx
      .selectDistinct({ trackId: lesionTracks.id, label: lesionTracks.label })
      .from(lesions)
      .innerJoin(visits, eq(visits.id, lesions.visitId))
      .innerJoin(lesionTracks, eq(lesionTracks.id, lesions.trackId))
      .where(earlierThan(v.patientId, v.visitDate))
      .execute(),
    tx.select({ trackId: lesions.trackId }).from(lesions).where(and(eq(lesions.visitId, v.id), isNotNull(lesions.trackId))).execute(),
    tx.select({ trackId: trackChecks.trackId, outcome: trackChecks.outcome }).from(trackChecks).where(eq(trackChecks.visitId, v.id)).execute(),
  ]);
  return { earlier, foundHere: found.map((f) => f.trackId), checks };
}

export async function markVisitSigned(tx: Tx, visitId: string, signedBy: string, signedAt: Date, version: number): Promise<void> {
  await tx.update(visits).set({ status: "signed", signedAt, signedBy, version, updatedAt: signedAt }).where(eq(visits.id, visitId));
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

export async function visitForAddendum(tx: Tx, scope: SiteScope, visitId: string) {
  const [v] = await tx
    .select({ id: visits.id, patientId: visits.patientId, siteId: visits.siteId, status: visits.status })
    .from(visits)
    .where(and(eq(visits.id, visitId), inScope(visits.siteId, scope)))
    .limit(1);
  return v ?? null;
}

export async function insertAddendum(tx: Tx, values: typeof addenda.$inferInsert) {
  const [row] = await tx.insert(addenda).values(values).returning({ id: addenda.id, createdAt: addenda.createdAt });
  return row!;
}
