import { deleteAttachment, findAttachment } from "@/db/queries/attachments";
import { recordAudit } from "@/db/queries/audit-write";
import { scopeOf } from "@/lib/auth/guard";
import { AppError } from "@/lib/errors";
import { idParam, route } from "@/lib/http/route";
import { deleteObjects, getObject } from "@/lib/storage";
import { downloadName } from "@/lib/uploads";

const EXT: Record<string, string> = { "image/jpeg": "jpg", "image/png": "png", "image/webp": "webp", "application/pdf": "pdf" };

/** Streams the stored file after the guard; every view, thumbnails included, is audited. */
export const GET = route<{ attachmentId: string }>({ roles: ["clinician", "reviewer"] }, async ({ req, user, params, ip }) => {
  const id = idParam(params.attachmentId);
  const a = await findAttachment(scopeOf(user), id);
  const thumb = new URL(req.url).searchParams.get("thumb") === "1" && a.thumbKey !== null;
  const key = thumb ? a.thumbKey! : a.objectKey;
  const contentType = thumb ? "image/webp" : a.contentType;
  const obj = await getObject(key);
  if (!obj) throw new AppError("not_found", "The stored file is missing. Tell the clinic's administrator.");
  await recordAudit({
    userId: user.id, siteId: a.siteId, patientId: a.patientId, action: thumb ? "attachment.view_thumb" : "attachment.view",
    entityType: "attachment", entityId: a.id, ip, detail: { visitId: a.visitId },
  });
  const name = downloadName(a.kind, a.visitDate, a.id, thumb ? "webp" : (EXT[a.contentType] ?? "bin"));
  const headers: Record<string, string> = {
    "content-type": contentType,
    // Photographs open in the page; documents download, so no stored PDF runs in our origin.
    "content-disposition": `${a.kind === "photo" ? "inline" : "attachment"}; filename="${name}"`,
    "x-content-type-options": "nosniff",
    "content-security-policy": "default-src 'none'; sandbox",
    "cache-control": "private, no-store",
  };
  if (!thumb) headers["x-dentate-sha256"] = a.sha256;
  if (obj.contentLength !== undefined) headers["content-length"] = String(obj.contentLength);
  return new Response(obj.body, { status: 200, headers });
});

export const DELETE = route<{ attachmentId: string }>({ roles: ["clinician"] }, async ({ user, params, ip }) => {
  const id = idParam(params.attachmentId);
  const row = await deleteAttachment(scopeOf(user), id);
  // The row is gone first; an object left by a failed delete is only unreachable, never shown.
  await deleteObjects([row.objectKey, row.thumbKey ?? ""]).catch((e) => console.error("[dentate] could not remove objects", row.objectKey, e));
  await recordAudit({ userId: user.id, siteId: row.siteId, patientId: row.patientId, action: "attachment.delete", entityType: "attachment", entityId: id, ip, detail: { visitId: row.visitId } });
  return { ok: true };
});
