"use client";
import useSWR from "swr";
import { useState } from "react";
import { ApiError, fetcher, sendJson } from "@/components/data/fetcher";
import { Button } from "@/components/ui/button";
import type { DisplayConvention } from "@/lib/geometry";
import { attachmentPlace, formatBytes } from "./describe-attachment";
import { UploadControl } from "./upload-control";
import type { AttachmentDto, GalleryDto } from "./types";
import { api } from "@/components/data/keys";

export interface VisitGalleryProps {
  visitId: string;
  /** Clinicians may add files; the server checks the role again. */
  canUpload: boolean;
  /** Show only one lesion's files (and upload to it). */
  lesionId?: string;
  convention?: DisplayConvention;
}

function Tile({ a, conv, canDelete, onDelete }: { a: AttachmentDto; conv: DisplayConvention; canDelete: boolean; onDelete: (id: string) => void }) {
  const href = api.attachment(a.id);
  const place = attachmentPlace(a, conv);
  return (
    <li className="grid content-start gap-2 rounded-lg border border-rule bg-panel p-2">
      <a href={href} target="_blank" rel="noopener" className="block overflow-hidden rounded-md bg-paper" aria-label={`Open ${a.kind === "photo" ? "photograph" : "document"}: ${place}`}>
        {a.kind === "photo" && a.hasThumb ? (
          // eslint-disable-next-line @next/next/no-img-element -- served through the authorised route, not the image optimiser
          <img src={`${href}?thumb=1`} alt={a.caption ?? `Photograph, ${place}`} loading="lazy" className="aspect-[4/3] w-full object-cover" />
        ) : (
          <span className="flex aspect-[4/3] w-full flex-col items-center justify-center gap-1 text-ink-soft">
            <svg viewBox="0 0 24 24" width="40" height="40" aria-hidden="true" fill="none" stroke="currentColor" strokeWidth="1.6">
              <path d="M6 2h8l5 5v15H6z" />
              <path d="M14 2v5h5M9 13h7M9 17h7" />
            </svg>
            <span className="text-sm font-semibold">PDF document</span>
          </span>
        )}
      </a>
      <p className="text-sm font-semibold text-ink">{place}</p>
      {a.caption && <p className="text-sm text-ink-soft">{a.caption}</p>}
      <p className="text-xs text-ink-soft">
        {a.kind === "photo" ? "Photograph" : "Document"} · {formatBytes(a.byteSize)} · {a.createdAt.slice(0, 10)}
      </p>
      {canDelete && (
        <Button variant="ghost" className="justify-self-start" onClick={() => onDelete(a.id)}>
          Remove
        </Button>
      )}
    </li>
  );
}

/** Photographs and documents of a visit (or of one lesion), with upload and the PDF report link. */
export function VisitGallery({ visitId, canUpload, lesionId, convention = "lithotomy" }: VisitGalleryProps) {
  const key = api.visitPart(visitId, "attachments");
  const { data, error, isLoading, mutate } = useSWR<GalleryDto>(key, fetcher);
  const [actionError, setActionError] = useState<string | null>(null);
  const items = (data?.attachments ?? []).filter((a) => !lesionId || a.lesionId === lesionId);
  const draft = data?.visitStatus === "draft";

  async function remove(id: string) {
    if (!window.confirm("Remove this file from the visit?")) return;
    setActionError(null);
    try {
      await sendJson("DELETE", api.attachment(id));
      await mutate();
    } catch (err) {
      setActionError(err instanceof ApiError ? err.message : "The file could not be removed.");
    }
  }

  return (
    <section aria-labelledby={`gallery-${visitId}`} className="grid gap-4">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <h2 id={`gallery-${visitId}`} className="text-lg font-semibold text-ink">
          {lesionId ? "Photographs and documents of this lesion" : "Photographs and documents"}
        </h2>
        {!lesionId && (
          <span className="flex flex-wrap gap-2">
            <a className="inline-flex min-h-11 items-center rounded-md border border-rule-strong bg-panel px-4 font-semibold text-lagoon-700 hover:bg-lagoon-50" href={`/api/visits/${visitId}/report?paper=a4`}>
              Download visit report (PDF)
            </a>
            <a className="inline-flex min-h-11 items-center rounded-md px-3 text-sm text-lagoon-700 underline hover:bg-lagoon-50" href={`/api/visits/${visitId}/report?paper=letter`}>
              Letter size
            </a>
          </span>
        )}
      </div>
      {error && (
        <p role="alert" className="rounded-md border border-danger-rule bg-danger-bg px-3 py-2 text-sm text-danger-ink">
          {error instanceof ApiError ? error.message : "The files could not be loaded."}
        </p>
      )}
      {actionError && (
        <p role="alert" className="rounded-md border border-danger-rule bg-danger-bg px-3 py-2 text-sm text-danger-ink">
          {actionError}
        </p>
      )}
      {isLoading && <p className="text-sm text-ink-soft">Loading files…</p>}
      {data && items.length === 0 && <p className="text-sm text-ink-soft">No photographs or documents yet.</p>}
      {items.length > 0 && (
        <ul className="grid grid-cols-[repeat(auto-fill,minmax(12rem,1fr))] gap-3">
          {items.map((a) => (
            <Tile key={a.id} a={a} conv={convention} canDelete={canUpload && draft} onDelete={remove} />
          ))}
        </ul>
      )}
      {canUpload && data && <UploadControl visitId={visitId} lesions={data.lesions} lesionId={lesionId} maxBytes={data.maxBytes} onUploaded={() => void mutate()} />}
    </section>
  );
}
