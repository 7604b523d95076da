import { GRADE_LABEL } from "@/lib/domain/vocab";
import { describeSite, type DisplayConvention } from "@/lib/geometry";
import type { AttachmentDto } from "./types";

/** "L2 · HSIL · 1 to 3 o'clock (…), 1–2 cm from the verge", or the visit as a whole. */
export function attachmentPlace(a: AttachmentDto, conv: DisplayConvention = "lithotomy"): string {
  if (!a.lesion) return "Whole visit";
  const l = a.lesion;
  return `${l.label} · ${GRADE_LABEL[l.grade]} · ${describeSite(l.clockStartH, l.clockEndH, l.distanceStartCm, l.distanceEndCm, conv)}`;
}

export function formatBytes(n: number): string {
  if (n < 1024 * 1024) return `${Math.max(1, Math.round(n / 1024))} KB`;
  return `${Math.round((n / (1024 * 1024)) * 10) / 10} MB`;
}
