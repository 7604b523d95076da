import type { Grade } from "@/lib/domain/vocab";

/** GET /api/visits/[visitId]/attachments, as the gallery reads it. */
export interface AttachmentDto {
  id: string;
  lesionId: string | null;
  kind: "photo" | "document";
  contentType: string;
  byteSize: number;
  caption: string | null;
  hasThumb: boolean;
  createdAt: string;
  lesion: { label: string; grade: Grade; clockStartH: number; clockEndH: number; distanceStartCm: number; distanceEndCm: number } | null;
}

export interface GalleryDto {
  visitStatus: "draft" | "signed";
  attachments: AttachmentDto[];
  lesions: { id: string; label: string }[];
  maxBytes: number;
}
