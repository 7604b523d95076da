import { z } from "zod";
import { text } from "@/lib/validation/text";
import { listAttachments, uploadAttachment } from "@/lib/server/attachments";
import { scopeOf } from "@/lib/auth/guard";
import { AppError } from "@/lib/errors";
import { idParam, json, parseWith, route } from "@/lib/http/route";
import { maxUploadBytes, readMultipartLimited } from "@/lib/uploads";

const fieldsSchema = z.object({
  lesionId: z.union([z.literal(""), z.string().uuid("Not a lesion of this visit.")]).optional(),
  addendumId: z.union([z.literal(""), z.string().uuid("Not an addendum of this visit.")]).optional(),
  caption: text().trim().max(500, "Keep the caption under 500 characters.").optional(),
});

export const GET = route<{ visitId: string }>({ roles: ["clinician", "reviewer"] }, async ({ user, params, ip }) => {
  const { visit, attachments, lesions } = await listAttachments(scopeOf(user), idParam(params.visitId), ip);
  return { visitStatus: visit.status, attachments, lesions, maxBytes: maxUploadBytes(process.env) };
});

export const POST = route<{ visitId: string }>({ roles: ["clinician"] }, async ({ req, user, params, ip }) => {
  const visitId = idParam(params.visitId);
  const maxBytes = maxUploadBytes(process.env);
  const form = await readMultipartLimited(req, maxBytes);
  const file = form.get("file");
  if (!(file instanceof Blob) || file.size === 0) throw new AppError("invalid", undefined, { file: ["Choose a file to upload."] });
  const text = (k: string) => {
    const v = form.get(k);
    return typeof v === "string" ? v : undefined;
  };
  const fields = parseWith(fieldsSchema, { lesionId: text("lesionId"), addendumId: text("addendumId"), caption: text("caption") });
  const attachment = await uploadAttachment(
    scopeOf(user), visitId,
    { bytes: new Uint8Array(await file.arrayBuffer()), lesionId: fields.lesionId || null, addendumId: fields.addendumId || null, caption: fields.caption || null, maxBytes },
    ip,
  );
  return json({ attachment }, 201);
});
