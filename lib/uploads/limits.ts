// Upload size limit. 15 MB holds a full-resolution photograph from a phone or a scope camera
// with room to spare, and a scanned pathology report. Configurable per deployment.

export const DEFAULT_MAX_UPLOAD_BYTES = 15 * 1024 * 1024;

/** Multipart framing and the small text fields around the file. */
export const MULTIPART_OVERHEAD_BYTES = 64 * 1024;

/** Reads DENTATE_MAX_UPLOAD_MB; anything unusable falls back to the default. */
export function maxUploadBytes(env: Record<string, string | undefined> = {}): number {
  const mb = Number(env.DENTATE_MAX_UPLOAD_MB);
  if (!Number.isFinite(mb) || mb <= 0 || mb > 200) return DEFAULT_MAX_UPLOAD_BYTES;
  return Math.round(mb * 1024 * 1024);
}

export function formatMegabytes(bytes: number): string {
  return `${Math.round((bytes / (1024 * 1024)) * 10) / 10} MB`;
}
