"use client";
import { useId, useRef, useState } from "react";
import { ApiError } from "@/components/data/fetcher";
import { Button } from "@/components/ui/button";
import { uploadWithProgress } from "./upload-xhr";
import { formatBytes } from "./describe-attachment";
import { api } from "@/components/data/keys";

interface Props {
  visitId: string;
  lesions: { id: string; label: string }[];
  /** Preselect (and lock to) one lesion when the gallery is shown for a lesion. */
  lesionId?: string;
  maxBytes: number;
  onUploaded: () => void;
}

/** The browser's hint only; the server decides by the file's content. */
const ACCEPT = "image/jpeg,image/png,image/webp,application/pdf";

export function UploadControl({ visitId, lesions, lesionId, maxBytes, onUploaded }: Props) {
  const inputId = useId();
  const fileRef = useRef<HTMLInputElement>(null);
  const [file, setFile] = useState<File | null>(null);
  const [target, setTarget] = useState(lesionId ?? "");
  const [caption, setCaption] = useState("");
  const [progress, setProgress] = useState<number | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [done, setDone] = useState<string | null>(null);

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    if (!file) return setError("Choose a photograph or PDF first.");
    if (file.size > maxBytes) return setError(`The file is larger than the ${formatBytes(maxBytes)} limit.`);
    const form = new FormData();
    form.set("file", file);
    if (target) form.set("lesionId", target);
    if (caption.trim()) form.set("caption", caption.trim());
    setError(null);
    setDone(null);
    setProgress(0);
    try {
      await uploadWithProgress(api.visitPart(visitId, "attachments"), form, setProgress);
      setDone(`${file.name} added.`);
      setFile(null);
      setCaption("");
      if (fileRef.current) fileRef.current.value = "";
      onUploaded();
    } catch (err) {
      setError(err instanceof ApiError ? err.message : "The upload failed. Try again.");
    } finally {
      setProgress(null);
    }
  }

  return (
    <form onSubmit={submit} className="grid gap-3 rounded-lg border border-rule bg-panel p-4" aria-label="Add a photograph or document">
      <label
        htmlFor={inputId}
        className="flex min-h-20 cursor-pointer flex-col items-center justify-center rounded-md border-2 border-dashed border-rule-strong px-4 py-3 text-center hover:bg-lagoon-50"
      >
        <span className="text-base font-semibold text-ink">{file ? file.name : "Choose a photograph or PDF"}</span>
        <span className="text-sm text-ink-soft">
          JPEG, PNG, WebP or PDF, up to {formatBytes(maxBytes)}. Location and camera details are removed from photographs.
        </span>
      </label>
      <input
        id={inputId}
        ref={fileRef}
        type="file"
        accept={ACCEPT}
        className="sr-only"
        onChange={(e) => {
          setFile(e.target.files?.[0] ?? null);
          setError(null);
          setDone(null);
        }}
      />
      <div className="grid gap-3 sm:grid-cols-2">
        <label className="grid gap-1 text-sm font-semibold text-ink">
          Belongs to
          <select
            className="min-h-11 rounded-md border border-rule-strong bg-panel px-3 text-base font-normal"
            value={target}
            disabled={Boolean(lesionId)}
            onChange={(e) => setTarget(e.target.value)}
          >
            <option value="">The whole visit</option>
            {lesions.map((l) => (
              <option key={l.id} value={l.id}>
                Lesion {l.label}
              </option>
            ))}
          </select>
        </label>
        <label className="grid gap-1 text-sm font-semibold text-ink">
          Caption (optional)
          <input
            className="min-h-11 rounded-md border border-rule-strong bg-panel px-3 text-base font-normal"
            value={caption}
            maxLength={500}
            onChange={(e) => setCaption(e.target.value)}
          />
        </label>
      </div>
      <div className="flex flex-wrap items-center gap-3">
        <Button type="submit" disabled={progress !== null || !file}>
          {progress !== null ? "Uploading…" : "Upload"}
        </Button>
        {progress !== null && (
          <progress className="h-3 w-48" max={1} value={progress} aria-label="Upload progress">
            {Math.round(progress * 100)}%
          </progress>
        )}
        <p role="status" aria-live="polite" className="text-sm text-ok-ink">
          {done}
        </p>
      </div>
      {error && (
        <p role="alert" className="rounded-md border border-danger-rule bg-danger-bg px-3 py-2 text-sm text-danger-ink">
          {error}
        </p>
      )}
    </form>
  );
}
