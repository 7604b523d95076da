import { createHash } from "node:crypto";
import sharp from "sharp";
import { sniffUpload, ACCEPTED_DESCRIPTION, type AcceptedMime, type AttachmentKind } from "./sniff";
import { formatMegabytes } from "./limits";

// Turns an uploaded file into what we store: images re-encoded without their metadata
// (GPS position, device, dates), a small thumbnail, and a checksum of the stored bytes.

export const THUMB_WIDTH_PX = 320;
/** Refuse pixel bombs before decoding: 50 megapixels is beyond any clinical camera. */
export const MAX_INPUT_PIXELS = 50_000_000;

export type UploadRefusal = { reason: "unsupported_type" | "too_large" | "unreadable"; message: string };

export interface PreparedUpload {
  kind: AttachmentKind;
  mime: AcceptedMime;
  ext: string;
  bytes: Uint8Array;
  sha256: string;
  thumb: Uint8Array | null;
}

export function sha256Hex(bytes: Uint8Array): string {
  return createHash("sha256").update(bytes).digest("hex");
}

/**
 * sharp drops all metadata on output unless asked to keep it (we never call withMetadata);
 * rotate() first applies the EXIF orientation to the pixels so the picture stays upright
 * once the orientation tag is gone.
 */
async function reencode(bytes: Uint8Array, mime: AcceptedMime): Promise<Uint8Array> {
  const img = sharp(bytes, { limitInputPixels: MAX_INPUT_PIXELS, failOn: "error" }).rotate();
  const out =
    mime === "image/png"
      ? img.png({ compressionLevel: 8 })
      : mime === "image/webp"
        ? img.webp({ quality: 90 })
        : img.jpeg({ quality: 90, mozjpeg: true });
  return new Uint8Array(await out.toBuffer());
}

async function thumbnail(bytes: Uint8Array): Promise<Uint8Array> {
  const buf = await sharp(bytes, { limitInputPixels: MAX_INPUT_PIXELS })
    .resize({ width: THUMB_WIDTH_PX, height: THUMB_WIDTH_PX, fit: "inside", withoutEnlargement: true })
    .webp({ quality: 75 })
    .toBuffer();
  return new Uint8Array(buf);
}

export async function prepareUpload(
  bytes: Uint8Array,
  maxBytes: number,
): Promise<{ ok: true; upload: PreparedUpload } | { ok: false; refusal: UploadRefusal }> {
  if (bytes.byteLength > maxBytes) {
    return { ok: false, refusal: { reason: "too_large", message: `The file is larger than the ${formatMegabytes(maxBytes)} limit.` } };
  }
  const type = await sniffUpload(bytes);
  if (!type) {
    return {
      ok: false,
      refusal: { reason: "unsupported_type", message: `This file's content is not one Dentate accepts: upload ${ACCEPTED_DESCRIPTION}.` },
    };
  }
  if (type.kind === "document") {
    return { ok: true, upload: { ...type, bytes, sha256: sha256Hex(bytes), thumb: null } };
  }
  try {
    const clean = await reencode(bytes, type.mime);
    return { ok: true, upload: { ...type, bytes: clean, sha256: sha256Hex(clean), thumb: await thumbnail(clean) } };
  } catch {
    return { ok: false, refusal: { reason: "unreadable", message: "The image could not be read. It may be damaged or too large in pixels." } };
  }
}
