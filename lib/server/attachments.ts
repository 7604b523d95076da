import "server-only";
import { randomUUID } from "node:crypto";
import { db } from "@/db/client";
import {
  addendumIsOnVisit, attachmentKeysInScope, deleteAttachmentRow, findAttachment, insertAttachmentRow, lesionBelongsToVisit, lesionIsOnVisit, listAttachmentsForVisit, visitForUpload,
} from "@/db/queries/attachments";
import { loadVisit, lockDraftVisit } from "@/db/queries/visit-access";
import { recordAudit } from "@/db/queries/audit-write";
import type { SiteScope } from "@/db/queries/scope";
import { AppError } from "@/lib/errors";
import { deleteObjects, getObject, putObject } from "@/lib/storage";
import { attachmentKeys, prepareUpload } from "@/lib/uploads";

/** A visit's attachments and its lesions (to link a photograph to), the read audited. */
export async function listAttachments(scope: SiteScope, visitId: string, ip: string) {
  const r = await listAttachmentsForVisit(scope, visitId);
  await recordAudit({ userId: scope.userId, siteId: r.visit.siteId, patientId: r.visit.patientId, action: "attachment.list", entityType: "visit", entityId: visitId, ip });
  return r;
}

export interface UploadRequest {
  bytes: Uint8Array;
  lesionId: string | null;
  /** Required once the visit is signed: the addendum the file belongs to. */
  addendumId: string | null;
  caption: string | null;
  maxBytes: number;
}

/**
 * A signed visit keeps its files as they were when signed (removing one is refused with 423 too);
 * a file added later belongs to an addendum of that visit, or it is refused with 423.
 */
async function checkSignedLock(run: Parameters<typeof addendumIsOnVisit>[0], visit: { id: string; status: string }, addendumId: string | null) {
  if (visit.status === "draft") {
    if (addendumId) throw new AppError("invalid", undefined, { addendumId: ["A draft visit has no addenda: attach the file to the visit itself."] });
    return;
  }
  if (!addendumId) throw new AppError("locked", "This visit is signed: a file added now must belong to an addendum. Write the addendum first, then attach the file to it.");
  if (!(await addendumIsOnVisit(run, addendumId, visit.id))) throw new AppError("invalid", undefined, { addendumId: ["This addendum is not part of this visit."] });
}

/**
 * Stores a photograph or document of a visit: the bytes are sniffed (the file's name and declared
 * type are ignored), photographs lose their metadata and get a thumbnail, the objects are written
 * first and the row after; if anything fails after the first put, nothing is left behind.
 */
export async function uploadAttachment(scope: SiteScope, visitId: string, req: UploadRequest, ip: string) {
  const visit = await loadVisit(db, scope, visitId);
  await checkSignedLock(db, visit, req.addendumId);
  if (req.lesionId && !(await lesionBelongsToVisit(scope, visitId, req.lesionId))) {
    throw new AppError("invalid", undefined, { lesionId: ["This lesion is not part of this visit."] });
  }
  const prepared = await prepareUpload(req.bytes, req.maxBytes);
  if (!prepared.ok) {
    throw new AppError(prepared.refusal.reason === "too_large" ? "too_large" : "unsupported_media", prepared.refusal.message);
  }
  const up = prepared.upload;
  const id = randomUUID();
  const keys = attachmentKeys({ siteId: visit.siteId, visitId, attachmentId: id, ext: up.ext }, up.thumb !== null);
  const written: string[] = [];
  try {
    await putObject(keys.objectKey, up.bytes, up.mime, up.sha256);
    written.push(keys.objectKey);
    if (up.thumb && keys.thumbKey) {
      await putObject(keys.thumbKey, up.thumb, "image/webp");
      written.push(keys.thumbKey);
    }
    await db.transaction(async (tx) => {
      const v = await visitForUpload(tx, scope, visitId);
      if (!v) throw new AppError("not_found");
      // Checked again under the share lock: a visit signed meanwhile is signed now.
      await checkSignedLock(tx, v, req.addendumId);
      // Checked again inside the transaction, so a lesion deleted meanwhile cannot leave a dangling link.
      if (req.lesionId && !(await lesionIsOnVisit(tx, req.lesionId, visitId))) {
        throw new AppError("invalid", undefined, { lesionId: ["This lesion is not part of this visit."] });
      }
      await insertAttachmentRow(tx, {
        id, visitId, siteId: v.siteId, uploadedBy: scope.userId, lesionId: req.lesionId, addendumId: req.addendumId, kind: up.kind, contentType: up.mime,
        byteSize: up.bytes.byteLength, sha256: up.sha256, objectKey: keys.objectKey, thumbKey: keys.thumbKey, caption: req.caption,
      });
      await recordAudit({
        userId: scope.userId, siteId: v.siteId, patientId: v.patientId, action: "attachment.upload", entityType: "attachment", entityId: id, ip,
        detail: { visitId, addendumId: req.addendumId, kind: up.kind, contentType: up.mime, byteSize: up.bytes.byteLength, sha256: up.sha256 },
      }, tx);
    });
    return { id, kind: up.kind, contentType: up.mime, byteSize: up.bytes.byteLength, sha256: up.sha256, lesionId: req.lesionId, addendumId: req.addendumId };
  } catch (err) {
    await deleteObjects([...written]).catch((e) => console.error("[dentate] could not remove objects of a failed upload", written, e));
    if (err instanceof AppError) throw err;
    if ((err as { $metadata?: unknown }).$metadata !== undefined || (err as { code?: string }).code === "ECONNREFUSED") {
      throw new AppError("unavailable", "The file store is briefly unavailable. Try again in a moment.");
    }
    throw err;
  }
}

/** The stored file (or its thumbnail) for a download; every view is audited. */
export async function openAttachment(scope: SiteScope, attachmentId: string, wantThumb: boolean, ip: string) {
  const a = await findAttachment(scope, attachmentId);
  if (!a) throw new AppError("not_found");
  const thumb = wantThumb && a.thumbKey !== null;
  const obj = await getObject(thumb ? a.thumbKey! : a.objectKey);
  if (!obj) throw new AppError("not_found", "The stored file is missing. Tell the clinic's administrator.");
  await recordAudit({
    userId: scope.userId, siteId: a.siteId, patientId: a.patientId, action: thumb ? "attachment.view_thumb" : "attachment.view",
    entityType: "attachment", entityId: a.id, ip, detail: { visitId: a.visitId },
  });
  return { attachment: a, thumb, object: obj };
}

/** Removes an attachment of a draft visit (423 once signed): the row first, then its objects. */
export async function removeAttachment(scope: SiteScope, attachmentId: string, ip: string) {
  const row = await db.transaction(async (tx) => {
    const r = await attachmentKeysInScope(tx, scope, attachmentId);
    if (!r) throw new AppError("not_found");
    const visit = await lockDraftVisit(tx, scope, r.visitId);
    await deleteAttachmentRow(tx, r.id);
    await recordAudit({ userId: scope.userId, siteId: r.siteId, patientId: visit.patientId, action: "attachment.delete", entityType: "attachment", entityId: r.id, ip, detail: { visitId: r.visitId } }, tx);
    return r;
  });
  // An object left by a failed delete is only unreachable, never shown.
  await deleteObjects([row.objectKey, row.thumbKey ?? ""]).catch((e) => console.error("[dentate] could not remove objects", row.objectKey, e));
}
