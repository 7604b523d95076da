"use client";

import { useState } from "react";
import { Button } from "@/components/ui/button";
import { sendJson } from "@/components/data/fetcher";
import type { Role } from "@/lib/domain/vocab";
import type { TimelineReview } from "@/components/timeline/timeline-types";
import { AdjudicationRow, type AdjudicationDraft, type AdjudicationTarget } from "./adjudication-row";
import { api } from "@/components/data/keys";

export interface Reviewer {
  id: string;
  displayName: string;
}

const REVIEW_STATUS_WORDS = { requested: "requested, not started", in_progress: "in progress", signed_off: "signed off" } as const;

/**
 * The review of the later visit against the earlier one. A reviewer records a verdict per
 * track and signs off (the review is started on the first verdict if none is open); a
 * clinician asks a reviewer for one.
 */
export function ReviewPanel(props: {
  patientId: string;
  earlierId: string;
  laterId: string;
  review: TimelineReview | null;
  targets: readonly AdjudicationTarget[];
  user: { id: string; role: Role };
  reviewers: readonly Reviewer[];
  selectedTrackId: string | null;
  onSelectTrack: (trackId: string | null) => void;
  onChanged: () => Promise<unknown>;
}) {
  const { patientId, earlierId, laterId, review, targets, user, reviewers, selectedTrackId, onSelectTrack, onChanged } = props;
  const [picked, setPicked] = useState(reviewers[0]?.id ?? "");
  const [busy, setBusy] = useState(false);
  const [message, setMessage] = useState<{ tone: "ok" | "error"; text: string } | null>(null);

  const isReviewer = user.role === "reviewer";
  const open = review && review.status !== "signed_off" ? review : null;
  const assignedElsewhere = Boolean(open?.reviewerId && open.reviewerId !== user.id);
  // A signed-off review is final: changing a verdict means starting a new review of the pair.
  const [startingNew, setStartingNew] = useState(false);
  const canEdit = isReviewer && !assignedElsewhere && (Boolean(open) || !review || startingNew);
  const shown = open ?? (startingNew ? null : review);
  const nameOf = (id: string | null) => reviewers.find((r) => r.id === id)?.displayName ?? (id === user.id ? "you" : "a reviewer");

  const startReview = async (reviewerId: string) =>
    (await sendJson<{ review: { id: string } }>("POST", api.patientReviews(patientId), { visitId: laterId, comparedVisitId: earlierId, reviewerId })).review.id;

  const act = async (fn: () => Promise<string | void>) => {
    setBusy(true);
    setMessage(null);
    try {
      const text = await fn();
      await onChanged();
      if (text) setMessage({ tone: "ok", text });
    } catch (e) {
      setMessage({ tone: "error", text: e instanceof Error ? e.message : "That did not work." });
    } finally {
      setBusy(false);
    }
  };

  const saveVerdict = async (trackId: string, draft: AdjudicationDraft) => {
    const reviewId = open?.id ?? (await startReview(user.id));
    await sendJson("PUT", `/api/reviews/${reviewId}/adjudications`, { trackId, ...draft });
    await onChanged();
    setStartingNew(false);
  };

  const done = shown ? targets.filter((t) => shown.adjudications.some((a) => a.trackId === t.trackId)).length : 0;
  return (
    <section aria-labelledby="review-h" className="space-y-3">
      <div className="flex flex-wrap items-baseline gap-x-4">
        <h2 id="review-h" className="text-lg font-bold">Review of the later visit</h2>
        <p className="text-sm text-ink-soft" data-review-status={shown?.status ?? "none"}>
          {shown ? `Review ${REVIEW_STATUS_WORDS[shown.status]}, reviewer ${nameOf(shown.reviewerId)} · ${done} of ${targets.length} tracks reviewed` : "No review of this pair of visits yet."}
        </p>
      </div>
      {isReviewer && assignedElsewhere ? <p className="text-sm">This review is assigned to {nameOf(open!.reviewerId)}; you can read it but not change it.</p> : null}
      {canEdit && !open ? <p className="text-sm text-ink-soft">Recording your first verdict starts a review with you as the reviewer.</p> : null}
      {isReviewer && !open && review && !startingNew ? (
        <Button variant="secondary" onClick={() => setStartingNew(true)}>Start a new review of this pair</Button>
      ) : null}

      <ul className="space-y-2">
        {targets.map((t) => (
          <AdjudicationRow
            key={`${shown?.id ?? "none"}-${t.trackId}`}
            target={t}
            existing={shown?.adjudications.find((a) => a.trackId === t.trackId) ?? null}
            canEdit={canEdit}
            selected={t.trackId === selectedTrackId}
            onSelect={() => onSelectTrack(t.trackId === selectedTrackId ? null : t.trackId)}
            onSave={(draft) => saveVerdict(t.trackId, draft)}
          />
        ))}
        {targets.length === 0 ? <li className="text-sm text-ink-soft">No track has a status at the later visit.</li> : null}
      </ul>

      {canEdit && open ? (
        <div className="flex flex-wrap items-center gap-3">
          <Button disabled={busy || done < targets.length} onClick={() => act(async () => { await sendJson("POST", `/api/reviews/${open.id}/sign-off`); return "Review signed off."; })}>
            Sign off the review
          </Button>
          {done < targets.length ? <span className="text-sm text-ink-soft">Give a verdict on every track first ({targets.length - done} left).</span> : null}
        </div>
      ) : null}

      {user.role !== "reviewer" ? (
        <form className="flex flex-wrap items-end gap-2" onSubmit={(e) => { e.preventDefault(); act(async () => { await startReview(picked); return `Review requested from ${nameOf(picked)}.`; }); }}>
          <label className="text-sm font-semibold">
            Ask a reviewer to review this pair
            <select value={picked} onChange={(e) => setPicked(e.target.value)} className="mt-1 block min-h-11 rounded-md border border-rule-strong bg-panel px-2">
              {reviewers.length === 0 ? <option value="">No reviewer at this site</option> : null}
              {reviewers.map((r) => <option key={r.id} value={r.id}>{r.displayName}</option>)}
            </select>
          </label>
          <Button type="submit" variant="secondary" disabled={busy || !picked}>Request review</Button>
        </form>
      ) : null}
      {message ? <p role={message.tone === "error" ? "alert" : "status"} className={`text-sm ${message.tone === "error" ? "text-danger-ink" : "text-ok-ink"}`}>{message.text}</p> : null}
    </section>
  );
}
