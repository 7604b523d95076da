import "server-only";
import { and, asc, eq } from "drizzle-orm";
import { db, type Db, type Tx } from "../client";
import { addenda, attachments, lesions, visits } from "../schema";
import { inScope, type SiteScope } from "./scope";
import { loadVisit } from "./visit-access";

const listColumns = {
  id: attachments.id,
  visitId: attachments.visitId,
  lesionId: attachments.lesionId,
  kind: attachments.kind,
  contentType: attachments.contentType,
  byteSize: attachments.byteSize,
  sha256: attachments.sha256,
  caption: attachments.caption,
  hasThumb: attachments.thumbKey,
  createdAt: attachments.createdAt,
  lesionLabel: lesions.label,
  lesionGrade: lesions.grade,
  clockStartH: lesions.clockStartH,
  clockEndH: lesions.clockEndH,
  distanceStartCm: lesions.distanceStartCm,
  distanceEndCm: lesions.distanceEndCm,
};

/** A visit's attachments with the map position of the lesion each one belongs to. */
export async function listAttachmentsForVisit(scope: SiteScope, visitId: string) {
  const visit = await loadVisit(db, scope, visitId);
  const rows = await db
    .select(listColumns)
    .from(attachments)
    .leftJoin(lesions, eq(lesions.id, attachments.lesionId))
    .where(and(eq(attachments.visitId, visitId), inScope(attachments.siteId, scope)))
    .orderBy(asc(attachments.createdAt), asc(attachments.id));
  const items = rows.map(({ hasThumb, lesionLabel, lesionGrade, clockStartH, clockEndH, distanceStartCm, distanceEndCm, ...a }) => ({
    ...a,
    hasThumb: Boolean(hasThumb),
    createdAt: a.createdAt.toISOString(),
    lesion:
      a.lesionId && lesionLabel && lesionGrade && clockStartH !== null && clockEndH !== null && distanceStartCm !== null && distanceEndCm !== null
        ? { label: lesionLabel, grade: lesionGrade, clockStartH, clockEndH, distanceStartCm, distanceEndCm }
        : null,
  }));
  const lesionRows = await db
    .select({ id: lesions.id, label: lesions.label })
    .from(lesions)
    .where(and(eq(lesions.visitId, visitId), inScope(lesions.siteId, scope)))
    .orderBy(asc(lesions.label));
  return { visit, attachments: items, lesions: lesionRows };
}

export type AttachmentListItem = Awaited<ReturnType<typeof listAttachmentsForVisit>>["attachments"][number];

/** True when the lesion was recorded at this visit. */
export async function lesionBelongsToVisit(scope: SiteScope, visitId: string, lesionId: string): Promise<boolean> {
  const [row] = await db
    .select({ id: lesions.id })
    .from(lesions)
    .where(and(eq(lesions.id, lesionId), eq(lesions.visitId, visitId), inScope(lesions.siteId, scope)))
    .limit(1);
  return Boolean(row);
}

export interface NewAttachment {
  id: string;
  lesionId: string | null;
  kind: "photo" | "document";
  contentType: string;
  byteSize: number;
  sha256: string;
  objectKey: string;
  thumbKey: string | null;
  caption: string | null;
}


/** The visit an upload belongs to, share-locked so it cannot be signed or removed meanwhile. */
export async function visitForUpload(tx: Tx, scope: SiteScope, visitId: string) {
  const [visit] = await tx
    .select({ id: visits.id, siteId: visits.siteId, patientId: visits.patientId, status: visits.status })
    .from(visits)
    .where(and(eq(visits.id, visitId), inScope(visits.siteId, scope)))
    .for("share")
    .limit(1);
  return visit ?? null;
}

export async function lesionIsOnVisit(tx: Tx, lesionId: string, visitId: string): Promise<boolean> {
  const [l] = await tx.select({ id: lesions.id }).from(lesions).where(and(eq(lesions.id, lesionId), eq(lesions.visitId, visitId))).limit(1);
  return Boolean(l);
}

export async function insertAttachmentRow(tx: Tx, values: typeof attachments.$inferInsert) {
  const [row] = await tx.insert(attachments).values(values).returning({ id: attachments.id, createdAt: attachments.createdAt });
  return row!;
}

/** One attachment the caller's sites may see, with what the download needs; or not_found. */
export async function findAttachment(scope: SiteScope, attachmentId: string) {
  const [row] = await db
    .select({
      id: attachments.id,
      visitId: attachments.visitId,
      siteId: attachments.siteId,
      kind: attachments.kind,
      contentType: attachments.contentType,
      byteSize: attachments.byteSize,
      sha256: attachments.sha256,
      objectKey: attachments.objectKey,
      thumbKey: attachments.thumbKey,
      patientId: visits.patientId,
      visitDate: visits.visitDate,
    })
    .from(attachments)
    .innerJoin(visits, eq(visits.id, attachments.visitId))
    .where(and(eq(attachments.id, attachmentId), inScope(attachments.siteId, scope)))
    .limit(1);
  return row ?? null;
}

/** An attachment's row and object keys, when the caller's sites may see it. */
export async function attachmentKeysInScope(tx: Tx, scope: SiteScope, attachmentId: string) {
  const [row] = await tx
    .select({ id: attachments.id, visitId: attachments.visitId, siteId: attachments.siteId, objectKey: attachments.objectKey, thumbKey: attachments.thumbKey })
    .from(attachments)
    .where(and(eq(attachments.id, attachmentId), inScope(attachments.siteId, scope)))
    .limit(1);
  return row ?? null;
}

export async function deleteAttachmentRow(tx: Tx, attachmentId: string): Promise<void> {
  await tx.delete(attachments).where(eq(attachments.id, attachmentId));
}

/** Whether the addendum was written on this visit. */
export async function addendumIsOnVisit(run: Db | Tx, addendumId: string, visitId: string): Promise<boolean> {
  const rows = await run.select({ id: addenda.id }).from(addenda).where(and(eq(addenda.id, addendumId), eq(addenda.visitId, visitId))).limit(1);
  return rows.length > 0;
}
