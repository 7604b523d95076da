import { fileTypeFromBuffer } from "file-type";

// What a file is, decided by its bytes alone. The name, the extension and the declared
// content type come from the client and are never trusted.

export const ACCEPTED_TYPES = {
  "image/jpeg": { ext: "jpg", kind: "photo" },
  "image/png": { ext: "png", kind: "photo" },
  "image/webp": { ext: "webp", kind: "photo" },
  "application/pdf": { ext: "pdf", kind: "document" },
} as const;

export type AcceptedMime = keyof typeof ACCEPTED_TYPES;
export type AttachmentKind = "photo" | "document";

export interface SniffedType {
  mime: AcceptedMime;
  ext: string;
  kind: AttachmentKind;
}

export const ACCEPTED_DESCRIPTION = "JPEG, PNG or WebP photographs and PDF documents";

function isAccepted(mime: string): mime is AcceptedMime {
  return Object.prototype.hasOwnProperty.call(ACCEPTED_TYPES, mime);
}

/** The accepted type these bytes really are, or null for anything else (HTML, programs, archives…). */
export async function sniffUpload(bytes: Uint8Array): Promise<SniffedType | null> {
  if (bytes.byteLength === 0) return null;
  const found = await fileTypeFromBuffer(bytes);
  if (!found || !isAccepted(found.mime)) return null;
  const t = ACCEPTED_TYPES[found.mime];
  return { mime: found.mime, ext: t.ext, kind: t.kind };
}
