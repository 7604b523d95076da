"use client";
import type { SaveInfo } from "./use-lesion-store";

/** Per-lesion save status: never silent about a failure, never loud about success. */
export function SaveLine({ info, pending }: { info?: SaveInfo; pending?: boolean }) {
  if (info?.state === "failed") {
    return (
      <span role="alert" className="inline-flex items-center gap-2 text-sm font-semibold text-danger-ink">
        {info.message ?? "Not saved"}
        {info.retry ? (
          <button type="button" onClick={info.retry} className="min-h-11 rounded-md border border-danger-rule bg-panel px-3 text-danger-ink hover:bg-danger-bg">
            Retry
          </button>
        ) : null}
      </span>
    );
  }
  if (info?.state === "saving" || pending) return <span role="status" className="text-sm text-ink-soft">Saving…</span>;
  return <span role="status" className="text-sm text-ok-ink">Saved</span>;
}
