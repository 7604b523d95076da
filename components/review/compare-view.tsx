"use client";

import Link from "next/link";
import { useEffect, useMemo, useState } from "react";
import useSWR from "swr";
import { MapLegend } from "@/components/canal-map";
import type { ApiError } from "@/components/data/fetcher";
import { CancerCautions } from "@/components/timeline/summary-panel";
import { summarizeTimeline } from "@/components/timeline/timeline-summary";
import { LoadState, lesionCountWords, lesionsByVisit } from "@/components/timeline/timeline-view";
import { timelineFetcher, timelineUrl, type Timeline, type TimelineVisit } from "@/components/timeline/timeline-types";
import { TrackMap } from "@/components/timeline/track-map";
import type { Role } from "@/lib/domain/vocab";
import type { DisplayConvention } from "@/lib/geometry";
import { diffVisits } from "@/lib/tracking/visit-diff";
import { DifferencesList } from "./differences-list";
import { OpenDisagreements } from "./open-disagreements";
import { checksAt, compareHref, orderedPair, reviewForPair, toDiffLesion } from "./review-model";
import { ReviewPanel, type Reviewer } from "./review-panel";

function VisitPicker({ label, visits, value, onChange }: { label: string; visits: readonly TimelineVisit[]; value: string; onChange: (id: string) => void }) {
  return (
    <label className="text-sm font-semibold">
      {label}
      <select value={value} onChange={(e) => onChange(e.target.value)} className="mt-1 block min-h-11 rounded-md border border-rule-strong bg-panel px-2">
        {visits.map((v) => <option key={v.id} value={v.id}>{v.visitDate} · {v.status === "signed" ? "signed" : "draft"} · {v.examiner}</option>)}
      </select>
    </label>
  );
}

export function CompareView(props: {
  patientId: string;
  convention: DisplayConvention;
  user: { id: string; role: Role };
  reviewers: readonly Reviewer[];
  initial: { a?: string; b?: string; track?: string };
}) {
  const { patientId, convention, user, reviewers } = props;
  const { data, error, mutate } = useSWR<Timeline, ApiError>(timelineUrl(patientId), timelineFetcher);
  const [picked, setPicked] = useState({ a: props.initial.a ?? null, b: props.initial.b ?? null } as { a: string | null; b: string | null });
  const [selectedTrackId, setSelectedTrackId] = useState<string | null>(props.initial.track ?? null);
  const [hoveredTrackId, setHoveredTrackId] = useState<string | null>(null);

  const pair = data ? orderedPair(data.visits, picked.a, picked.b) : null;
  const byVisit = useMemo(() => (data ? lesionsByVisit(data) : null), [data]);
  // The address follows the chosen pair, so a link from a disagreement opens the same view.
  useEffect(() => {
    if (pair) window.history.replaceState(null, "", compareHref(patientId, pair[0].id, pair[1].id, selectedTrackId));
  }, [patientId, pair?.[0].id, pair?.[1].id, selectedTrackId]); // eslint-disable-line react-hooks/exhaustive-deps

  if (!data || !byVisit) return <LoadState error={error} />;
  if (!pair) {
    return (
      <div className="space-y-3">
        <h1 className="text-2xl font-bold">Compare: {data.patient.name}</h1>
        <p>Compare opens on the latest two signed visits; this patient has {data.visits.filter((v) => v.status === "signed").length} signed of {data.visits.length}. A draft is compared only when both visits are chosen in the address.</p>
      </div>
    );
  }
  const [earlier, later] = pair;
  const before = byVisit.get(earlier.id) ?? [];
  const after = byVisit.get(later.id) ?? [];
  const earlierIndex = data.visits.findIndex((v) => v.id === earlier.id);
  const olderVisitIds = new Set(data.visits.slice(0, earlierIndex).map((v) => v.id));
  const seenBeforeEarlier = new Set(data.lesions.filter((l) => olderVisitIds.has(l.visitId) && l.trackId).map((l) => l.trackId!));
  const differences = diffVisits(before.map(toDiffLesion), after.map(toDiffLesion), { convention, laterChecks: checksAt(data, later.id), seenBeforeEarlier });
  const labelOf = new Map(data.tracks.map((t) => [t.id, t.label]));
  const targets = data.statuses
    .filter((s) => s.visitId === later.id)
    .map((s) => ({ trackId: s.trackId, label: labelOf.get(s.trackId) ?? "?", status: s.status, effectiveGrade: s.effectiveGrade, reason: s.reason }))
    .sort((x, y) => x.label.localeCompare(y.label, "en", { numeric: true }));
  const overall = summarizeTimeline(data);
  const shown = [...before, ...after].filter((l) => l.effectiveGrade === "suspected_cancer");
  const confirmed = new Set([...overall.confirmedCancer, ...shown.filter((l) => l.histology === "scc").map((l) => l.trackLabel ?? l.label)]);
  const cancer = new Set([...overall.suspectedCancer, ...shown.filter((l) => l.histology !== "scc").map((l) => l.trackLabel ?? l.label)]);
  const review = reviewForPair(data.reviews, earlier.id, later.id);

  const mapCard = (v: TimelineVisit, side: string, lesions: typeof before) => (
    <figure className="min-w-0 flex-1 rounded-lg border border-rule bg-panel p-2" data-compare-side={side}>
      <figcaption className="flex items-baseline justify-between px-1">
        <span><span className="font-bold">{side}:</span> <span className="tabular-nums">{v.visitDate}</span></span>
        <span className="text-sm text-ink-soft">{v.status === "signed" ? "Signed" : "Draft"} · {v.examiner} · {lesionCountWords(lesions.length)}</span>
      </figcaption>
      <div className="aspect-[720/564]">
        <TrackMap lesions={lesions} convention={convention} title={`${side} visit, ${v.visitDate}`} selectedTrackId={selectedTrackId} hoveredTrackId={hoveredTrackId} onSelectTrack={setSelectedTrackId} onHoverTrack={setHoveredTrackId} />
      </div>
    </figure>
  );

  return (
    <div className="space-y-6">
      <header className="flex flex-wrap items-end gap-x-6 gap-y-2">
        <div>
          <p className="no-print text-sm"><Link href={`/patients/${patientId}`} className="text-lagoon-700 underline">{data.patient.name}</Link> / <Link href={`/patients/${patientId}/timeline`} className="text-lagoon-700 underline">Timeline</Link> /</p>
          <h1 className="text-2xl font-bold">Compare: {data.patient.name}</h1>
          <p className="text-sm text-ink-soft">Earlier visit on the left. Choose a track on either map or in a list to ring it on both.</p>
        </div>
        <div className="no-print ml-auto flex flex-wrap gap-3">
          <VisitPicker label="Earlier visit" visits={data.visits} value={earlier.id} onChange={(id) => setPicked({ a: id, b: later.id })} />
          <VisitPicker label="Later visit" visits={data.visits} value={later.id} onChange={(id) => setPicked({ a: earlier.id, b: id })} />
        </div>
      </header>

      <CancerCautions confirmed={[...confirmed].sort()} suspected={[...cancer].sort()} />

      <div className="flex flex-col gap-3 lg:flex-row">
        {mapCard(earlier, "Earlier", before)}
        {mapCard(later, "Later", after)}
      </div>

      <div className="grid gap-6 lg:grid-cols-2">
        <section aria-labelledby="diff-h">
          <h2 id="diff-h" className="text-lg font-bold">What changed ({differences.length})</h2>
          <p className="mb-2 text-sm text-ink-soft">Same track across visits; moved means its middle shifted at least 1 hour round the clock or 1 cm in depth.</p>
          <DifferencesList differences={differences} selectedTrackId={selectedTrackId} onSelectTrack={setSelectedTrackId} onHoverTrack={setHoveredTrackId} />
        </section>
        <ReviewPanel
          patientId={patientId}
          earlierId={earlier.id}
          laterId={later.id}
          review={review}
          targets={targets}
          user={user}
          reviewers={reviewers}
          selectedTrackId={selectedTrackId}
          onSelectTrack={setSelectedTrackId}
          onChanged={() => mutate()}
        />
      </div>

      {user.role !== "reviewer" ? <OpenDisagreements patientId={patientId} canResolve={user.role === "clinician" || user.role === "admin"} /> : null}
      <MapLegend compact />
    </div>
  );
}
