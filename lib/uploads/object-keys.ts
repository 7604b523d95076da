import { z } from "zod";

// Object keys are built from ids the server made, never from the uploader's file name, so a
// name such as "../../x.jpg" or one holding NUL bytes has nothing to act on.

const uuid = z.string().uuid();

export interface KeyParts {
  siteId: string;
  visitId: string;
  attachmentId: string;
  ext: string;
}

export interface AttachmentKeys {
  objectKey: string;
  thumbKey: string | null;
}

const SAFE_EXT = /^[a-z0-9]{1,5}$/;

export function attachmentKeys(p: KeyParts, withThumb: boolean): AttachmentKeys {
  for (const id of [p.siteId, p.visitId, p.attachmentId]) {
    if (!uuid.safeParse(id).success) throw new RangeError("object keys are built from server-made ids only");
  }
  if (!SAFE_EXT.test(p.ext)) throw new RangeError("unexpected file extension");
  const base = `sites/${p.siteId}/visits/${p.visitId}/${p.attachmentId}`;
  return { objectKey: `${base}.${p.ext}`, thumbKey: withThumb ? `${base}.thumb.webp` : null };
}

/**
 * A download name for Content-Disposition, from our own words only (the kind, the visit
 * date and a short id); ASCII letters, digits, dots and dashes.
 */
export function downloadName(kind: "photo" | "document", visitDate: string, attachmentId: string, ext: string): string {
  const safeDate = /^\d{4}-\d{2}-\d{2}$/.test(visitDate) ? visitDate : "undated";
  const shortId = attachmentId.replace(/[^a-f0-9]/gi, "").slice(0, 8);
  return `dentate-${kind}-${safeDate}-${shortId}.${SAFE_EXT.test(ext) ? ext : "bin"}`;
}
