import { randomUUID } from "node:crypto";
import { z } from "zod";
import { insertAttachment, lesionBelongsToVisit, listAttachmentsForVisit } from "@/db/queries/attachments";
import { loadVisit } from "@/db/queries/visit-access";
import { recordAudit } from "@/db/queries/audit-write";
import { db } from "@/db/client";
import { scopeOf } from "@/lib/auth/guard";
import { AppError } from "@/lib/errors";
import { idParam, json, parseWith, route } from "@/lib/http/route";
import { deleteObjects, putObject } from "@/lib/storage";
import { attachmentKeys, maxUploadBytes, prepareUpload, readMultipartLimited } from "@/lib/uploads";

const fieldsSchema = z.object({
  lesionId: z.union([z.literal(""), z.string().uuid("Not a lesion of this visit.")]).optional(),
  caption: z.string().trim().max(500, "Keep the caption under 500 characters.").optional(),
});

export const GET = route<{ visitId: string }>({ roles: ["clinician", "reviewer"] }, async ({ user, params, ip }) => {
  const visitId = idParam(params.visitId);
  const { visit, attachments, lesions } = await listAttachmentsForVisit(scopeOf(user), visitId);
  await recordAudit({ userId: user.id, siteId: visit.siteId, patientId: visit.patientId, action: "attachment.list", entityType: "visit", entityId: visitId, ip });
  return { visitStatus: visit.status, attachments, lesions, maxBytes: maxUploadBytes(process.env) };
});

export const POST = route<{ visitId: string }>({ roles: ["clinician"] }, async ({ req, user, params, ip }) => {
  const visitId = idParam(params.visitId);
  const scope = scopeOf(user);
  const visit = await loadVisit(db, scope, visitId);
  const maxBytes = maxUploadBytes(process.env);
  const form = await readMultipartLimited(req, maxBytes);

  const file = form.get("file");
  if (!(file instanceof Blob) || file.size === 0) throw new AppError("invalid", undefined, { file: ["Choose a file to upload."] });
  const text = (k: string) => {
    const v = form.get(k);
    return typeof v === "string" ? v : undefined;
  };
  const fields = parseWith(fieldsSchema, { lesionId: text("lesionId"), caption: text("caption") });
  const lesionId = fields.lesionId || null;
  if (lesionId && !(await lesionBelongsToVisit(scope, visitId, lesionId))) {
    throw new AppError("invalid", undefined, { lesionId: ["This lesion is not part of this visit."] });
  }

  // The file's name and declared type are ignored: only its bytes decide.
  const prepared = await prepareUpload(new Uint8Array(await file.arrayBuffer()), maxBytes);
  if (!prepared.ok) {
    throw new AppError(prepared.refusal.reason === "too_large" ? "too_large" : "unsupported_media", prepared.refusal.message);
  }
  const up = prepared.upload;
  const id = randomUUID();
  const keys = attachmentKeys({ siteId: visit.siteId, visitId, attachmentId: id, ext: up.ext }, up.thumb !== null);

  // Objects first, then the row; if anything fails after the first put, nothing is left behind.
  const written: string[] = [];
  try {
    await putObject(keys.objectKey, up.bytes, up.mime, up.sha256);
    written.push(keys.objectKey);
    if (up.thumb && keys.thumbKey) {
      await putObject(keys.thumbKey, up.thumb, "image/webp");
      written.push(keys.thumbKey);
    }
    const row = await insertAttachment(scope, visitId, {
      id,
      lesionId,
      kind: up.kind,
      contentType: up.mime,
      byteSize: up.bytes.byteLength,
      sha256: up.sha256,
      objectKey: keys.objectKey,
      thumbKey: keys.thumbKey,
      caption: fields.caption || null,
    });
    await recordAudit({
      userId: user.id, siteId: row.siteId, patientId: row.patientId, action: "attachment.upload", entityType: "attachment", entityId: id, ip,
      detail: { visitId, kind: up.kind, contentType: up.mime, byteSize: up.bytes.byteLength, sha256: up.sha256 },
    });
    return json({ attachment: { id, kind: up.kind, contentType: up.mime, byteSize: up.bytes.byteLength, sha256: up.sha256, lesionId } }, 201);
  } catch (err) {
    await deleteObjects([...written]).catch((e) => console.error("[dentate] could not remove objects of a failed upload", written, e));
    if (err instanceof AppError) throw err;
    if ((err as { $metadata?: unknown }).$metadata !== undefined || (err as { code?: string }).code === "ECONNREFUSED") {
      throw new AppError("unavailable", "The file store is briefly unavailable. Try again in a moment.");
    }
    throw err;
  }
});
