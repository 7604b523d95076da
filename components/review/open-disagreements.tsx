"use client";

import Link from "next/link";
import { useState } from "react";
import useSWR from "swr";
import { Button } from "@/components/ui/button";
import { fetcher, type ApiError } from "@/components/data/fetcher";
import { STATUS_LABEL } from "@/components/timeline/status-glyph";
import { DISAGREEMENT_OUTCOME_LABEL, type DisagreementOutcome, type TrackStatus } from "@/lib/domain/vocab";
import { compareHref } from "./review-model";
import { api } from "@/components/data/keys";
import { ResolveDisagreement } from "./resolve-disagreement";

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
  resolvedAt: string | null;
  resolvedBy: string | null;
  outcome: DisagreementOutcome | null;
  outcomeNote: string | null;
}

export const disagreementsUrl = (patientId: string) => api.patientReviews(patientId);

/**
 * A reviewer's open disagreements with this patient's track statuses. The clinician reads
 * them, acts in the record, then marks each one resolved, saying which status stands; resolved
 * ones stay listed with that outcome, who settled it and when.
 */
export function OpenDisagreements({ patientId, canResolve }: { patientId: string; canResolve: boolean }) {
  const { data, error, mutate } = useSWR<{ openDisagreements: Disagreement[]; resolvedDisagreements: Disagreement[] }, ApiError>(disagreementsUrl(patientId), fetcher);
  const [resolving, setResolving] = useState<string | null>(null);

  const items = data?.openDisagreements ?? [];
  const resolved = data?.resolvedDisagreements ?? [];
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
              {resolving === d.id ? (
                <ResolveDisagreement adjudicationId={d.id} trackLabel={d.trackLabel} onCancel={() => setResolving(null)} onDone={() => { setResolving(null); void mutate(); }} />
              ) : (
                <div className="mt-1 flex flex-wrap gap-2">
                  {d.comparedVisitId ? (
                    <Link href={compareHref(patientId, d.comparedVisitId, d.visitId)} className="inline-flex min-h-11 items-center font-semibold text-lagoon-700 underline">
                      Open in Compare
                    </Link>
                  ) : null}
                  {canResolve ? <Button variant="secondary" onClick={() => setResolving(d.id)}>Mark resolved</Button> : null}
                </div>
              )}
            </li>
          ))}
        </ul>
      ) : null}
      {resolved.length ? (
        <>
          <h3 className="mt-3 font-bold">Resolved ({resolved.length})</h3>
          <ul className="mt-1 space-y-1 text-sm">
            {resolved.map((d) => (
              <li key={d.id} data-resolved-disagreement={d.trackLabel} className="rounded-md border border-rule px-3 py-2">
                <p>
                  <span className="font-bold">{d.trackLabel}</span>: {d.reviewer ?? "The reviewer"} believed {d.proposedStatus ? STATUS_LABEL[d.proposedStatus] : "a different status"}.{" "}
                  <span className="font-semibold">{d.outcome ? DISAGREEMENT_OUTCOME_LABEL[d.outcome] : "Resolved without a recorded outcome"}</span>
                  {" "}· {d.resolvedBy ?? "unknown"}, {d.resolvedAt!.slice(0, 10)}
                </p>
                {d.outcomeNote ? <p className="italic">“{d.outcomeNote}”</p> : null}
              </li>
            ))}
          </ul>
        </>
      ) : null}
    </section>
  );
}
