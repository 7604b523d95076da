"use client";

import { useId, useState } from "react";
import { Button } from "@/components/ui/button";
import { ApiError } from "@/components/data/fetcher";
import { STATUS_LABEL, StatusMark } from "@/components/timeline/status-glyph";
import { GRADE_LABEL, TRACK_STATUSES, type Grade, type TrackStatus, type Verdict } from "@/lib/domain/vocab";
import type { TimelineAdjudication } from "@/components/timeline/timeline-types";

export interface AdjudicationTarget {
  trackId: string;
  label: string;
  status: TrackStatus;
  effectiveGrade: Grade | null;
  reason: string;
}

export interface AdjudicationDraft {
  verdict: Verdict;
  proposedStatus?: TrackStatus;
  comment?: string;
}

const VERDICT_WORDS: Record<Verdict, string> = { agree: "✓ agrees", disagree: "✗ disagrees", not_examined: "– not examined (could not be judged from the record)" };

/** One track's status at the later visit, and the reviewer's verdict on it. */
export function AdjudicationRow(props: {
  target: AdjudicationTarget;
  existing: TimelineAdjudication | null;
  canEdit: boolean;
  selected: boolean;
  onSelect: () => void;
  onSave: (draft: AdjudicationDraft) => Promise<void>;
}) {
  const { target, existing, canEdit, selected, onSelect, onSave } = props;
  const id = useId();
  const [open, setOpen] = useState(false);
  const [proposed, setProposed] = useState<TrackStatus | "">((existing?.proposedStatus as TrackStatus | null) ?? "");
  const [comment, setComment] = useState(existing?.comment ?? "");
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);

  const save = async (draft: AdjudicationDraft) => {
    setBusy(true);
    setError(null);
    try {
      await onSave(draft);
      setOpen(false);
    } catch (e) {
      const fields = e instanceof ApiError ? e.fields : undefined;
      setError(fields ? Object.values(fields).flat().join(" ") : e instanceof Error ? e.message : "Not saved.");
    } finally {
      setBusy(false);
    }
  };

  return (
    <li className={`rounded-md border p-3 ${selected ? "border-lagoon-600 bg-lagoon-50" : "border-rule bg-panel"}`} data-adjudication-track={target.label}>
      <div className="flex flex-wrap items-start gap-x-4 gap-y-1">
        <button type="button" onClick={onSelect} aria-pressed={selected} className="min-h-11 min-w-14 rounded-md px-2 font-bold text-lagoon-700 underline">
          {target.label}
        </button>
        <div className="min-w-48 flex-1 text-sm">
          <p><StatusMark status={target.status} />{target.effectiveGrade ? <span className="text-ink-soft"> · {GRADE_LABEL[target.effectiveGrade]}</span> : null}</p>
          <p className="text-ink-soft">{target.reason}</p>
          {existing ? (
            <p className="mt-1" data-verdict={existing.verdict}>
              <span className="font-semibold">Reviewer: {VERDICT_WORDS[existing.verdict]}</span>
              {existing.verdict === "disagree" && existing.proposedStatus ? <> — believes <span className="font-semibold">{STATUS_LABEL[existing.proposedStatus as TrackStatus]}</span></> : null}
              {existing.comment ? <span className="block italic">“{existing.comment}”</span> : null}
              {existing.resolvedAt ? <span className="block text-ink-soft">Resolved by the clinician.</span> : null}
            </p>
          ) : (
            <p className="mt-1 text-ink-soft">Not reviewed yet.</p>
          )}
        </div>
        {canEdit ? (
          // Under the track's status, full width: three verdicts beside it would squeeze the words.
          <div className="flex basis-full flex-wrap gap-2">
            <Button variant="secondary" disabled={busy} onClick={() => save({ verdict: "agree" })} aria-label={`Agree with ${target.label}: ${STATUS_LABEL[target.status]}`}>Agree</Button>
            <Button variant="secondary" disabled={busy} onClick={() => setOpen((o) => !o)} aria-expanded={open} aria-controls={`${id}-form`} aria-label={`Disagree with ${target.label}`}>Disagree…</Button>
            <Button variant="secondary" disabled={busy} onClick={() => save({ verdict: "not_examined" })} aria-label={`Not examined: ${target.label}`}>Not examined</Button>
          </div>
        ) : null}
      </div>
      {canEdit && open ? (
        <form
          id={`${id}-form`}
          className="mt-3 grid gap-2 sm:grid-cols-[14rem_1fr_auto] sm:items-end"
          onSubmit={(e) => {
            e.preventDefault();
            save({ verdict: "disagree", proposedStatus: proposed || undefined, comment: comment.trim() || undefined });
          }}
        >
          <label className="text-sm font-semibold">
            Status you believe
            <select value={proposed} onChange={(e) => setProposed(e.target.value as TrackStatus | "")} className="mt-1 block min-h-11 w-full rounded-md border border-rule-strong bg-panel px-2">
              <option value="">Choose…</option>
              {TRACK_STATUSES.filter((s) => s !== target.status).map((s) => <option key={s} value={s}>{STATUS_LABEL[s]}</option>)}
            </select>
          </label>
          <label className="text-sm font-semibold">
            Comment
            <textarea value={comment} onChange={(e) => setComment(e.target.value)} rows={2} maxLength={2000} className="mt-1 block w-full rounded-md border border-rule-strong bg-panel px-2 py-1 font-normal" />
          </label>
          <Button type="submit" disabled={busy} aria-label={`Save disagreement on ${target.label}`}>Save disagreement</Button>
        </form>
      ) : null}
      {error ? <p role="alert" className="mt-2 text-sm text-danger-ink">{error}</p> : null}
    </li>
  );
}
