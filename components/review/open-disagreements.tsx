"use client";

import Link from "next/link";
import { useState } from "react";
import useSWR from "swr";
import { Button } from "@/components/ui/button";
import { fetcher, sendJson, type ApiError } from "@/components/data/fetcher";
import { STATUS_LABEL } from "@/components/timeline/status-glyph";
import type { TrackStatus } from "@/lib/domain/vocab";
import { compareHref } from "./review-model";
import { api } from "@/components/data/keys";

interface Disagreement {
  id: string;
  trackLabel: string;
  proposedStatus: TrackStatus | null;
  comment: string | null;
  reviewer: string | null;
  createdAt: string;
  reviewId: string;
  visitId: string;
  comparedVisitId: string | null;
}

export const disagreementsUrl = (patientId: string) => api.patientReviews(patientId);

/**
 * A reviewer's open disagreements with this patient's track statuses. The clinician reads
 * them, acts in the record, then marks each one resolved.
 */
export function OpenDisagreements({ patientId, canResolve }: { patientId: string; canResolve: boolean }) {
  const { data, error, mutate } = useSWR<{ openDisagreements: Disagreement[] }, ApiError>(disagreementsUrl(patientId), fetcher);
  const [busy, setBusy] = useState<string | null>(null);
  const [failure, setFailure] = useState<string | null>(null);

  const resolve = async (id: string) => {
    setBusy(id);
    setFailure(null);
    try {
      await sendJson("POST", api.resolveAdjudication(id));
      await mutate();
    } catch (e) {
      setFailure(e instanceof Error ? e.message : "Not resolved.");
    } finally {
      setBusy(null);
    }
  };

  const items = data?.openDisagreements ?? [];
  return (
    <section aria-labelledby={`disagree-${patientId}`} className="rounded-lg border border-rule bg-panel p-3">
      <h2 id={`disagree-${patientId}`} className="font-bold">Open review disagreements</h2>
      {error ? <p role="alert" className="text-sm text-danger-ink">{error.message}</p> : null}
      {!data && !error ? <p role="status" className="text-sm text-ink-soft">Loading…</p> : null}
      {data && items.length === 0 ? <p className="text-sm text-ink-soft">None open.</p> : null}
      {items.length ? (
        <ul className="mt-2 space-y-2">
          {items.map((d) => (
            <li key={d.id} className="rounded-md border-l-4 border-caution-rule bg-caution-bg px-3 py-2 text-sm text-caution-ink" data-disagreement={d.trackLabel}>
              <p>
                <span className="font-bold">{d.trackLabel}</span>: {d.reviewer ?? "The reviewer"} believes{" "}
                <span className="font-semibold">{d.proposedStatus ? STATUS_LABEL[d.proposedStatus] : "a different status"}</span>
                <span className="text-ink-soft"> · {d.createdAt.slice(0, 10)}</span>
              </p>
              {d.comment ? <p className="italic">“{d.comment}”</p> : null}
              <div className="mt-1 flex flex-wrap gap-2">
                {d.comparedVisitId ? (
                  <Link href={compareHref(patientId, d.comparedVisitId, d.visitId)} className="inline-flex min-h-11 items-center font-semibold text-lagoon-700 underline">
                    Open in Compare
                  </Link>
                ) : null}
                {canResolve ? (
                  <Button variant="secondary" disabled={busy === d.id} onClick={() => resolve(d.id)}>Mark resolved</Button>
                ) : null}
              </div>
            </li>
          ))}
        </ul>
      ) : null}
      {failure ? <p role="alert" className="mt-2 text-sm text-danger-ink">{failure}</p> : null}
    </section>
  );
}
