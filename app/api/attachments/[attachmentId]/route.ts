import { openAttachment, removeAttachment } from "@/lib/server/attachments";
import { scopeOf } from "@/lib/auth/guard";
import { idParam, route } from "@/lib/http/route";
import { downloadName } from "@/lib/uploads";

const EXT: Record<string, string> = { "image/jpeg": "jpg", "image/png": "png", "image/webp": "webp", "application/pdf": "pdf" };

/** Streams the stored file after the guard; every view, thumbnails included, is audited. */
export const GET = route<{ attachmentId: string }>({ roles: ["clinician", "reviewer"] }, async ({ req, user, params, ip }) => {
  const wantThumb = new URL(req.url).searchParams.get("thumb") === "1";
  const { attachment: a, thumb, object: obj } = await openAttachment(scopeOf(user), idParam(params.attachmentId), wantThumb, ip);
  const name = downloadName(a.kind, a.visitDate, a.id, thumb ? "webp" : (EXT[a.contentType] ?? "bin"));
  const headers: Record<string, string> = {
    "content-type": thumb ? "image/webp" : a.contentType,
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
  await removeAttachment(scopeOf(user), idParam(params.attachmentId), ip);
  return { ok: true };
});
