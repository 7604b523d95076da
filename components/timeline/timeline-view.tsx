"use client";

import Link from "next/link";
import { useMemo, useState } from "react";
import useSWR from "swr";
import { MapLegend } from "@/components/canal-map";
import type { ApiError } from "@/components/data/fetcher";
import type { DisplayConvention } from "@/lib/geometry";
import { VisitGradeChart } from "./visit-grade-chart";
import { StatusGrid } from "./status-grid";
import { StatusLegend } from "./status-glyph";
import { CancerCautions, SummaryPanel } from "./summary-panel";
import { summarizeTimeline } from "./timeline-summary";
import { timelineFetcher, timelineUrl, trackLabelOf, type Timeline } from "./timeline-types";
import { TrackMap, type TrackLesion } from "./track-map";
import { compareHref, latestSignedPair } from "@/components/review/review-model";

export function lesionsByVisit(t: Timeline): Map<string, TrackLesion[]> {
  const out = new Map<string, TrackLesion[]>(t.visits.map((v) => [v.id, []]));
  for (const l of t.lesions) out.get(l.visitId)?.push({ ...l, trackLabel: trackLabelOf(t, l.trackId) });
  return out;
}

export const lesionCountWords = (n: number) => `${n} ${n === 1 ? "lesion" : "lesions"}`;

export function LoadState({ error }: { error?: ApiError }) {
  if (error) {
    return <p role="alert" className="rounded-md border-l-4 border-danger-rule bg-danger-bg px-3 py-2 text-danger-ink">{error.status === 404 ? "This patient was not found." : error.message}</p>;
  }
  return <p role="status" className="text-ink-soft">Loading the timeline…</p>;
}

export function TimelineView({ patientId, convention, todayIso }: { patientId: string; convention: DisplayConvention; todayIso: string }) {
  const { data, error } = useSWR<Timeline, ApiError>(timelineUrl(patientId), timelineFetcher);
  const [selectedTrackId, setSelectedTrackId] = useState<string | null>(null);
  const byVisit = useMemo(() => (data ? lesionsByVisit(data) : new Map<string, TrackLesion[]>()), [data]);
  const summary = useMemo(() => (data ? summarizeTimeline(data) : null), [data]);
  if (!data || !summary) return <LoadState error={error} />;

  const selectedLabel = trackLabelOf(data, selectedTrackId);
  // Signed visits only: an unsigned draft has no statuses yet and would compare as if nothing were found.
  const latestTwo = latestSignedPair(data.visits);
  return (
    <div className="space-y-6">
      <header className="flex flex-wrap items-end gap-x-6 gap-y-2">
        <div>
          <p className="text-sm no-print"><Link href="/patients" className="text-lagoon-700 underline">Patients</Link> / <Link href={`/patients/${patientId}`} className="text-lagoon-700 underline">{data.patient.name}</Link> /</p>
          <h1 className="text-2xl font-bold">Timeline: {data.patient.name}</h1>
          <p className="text-sm text-ink-soft">MRN <span className="tabular-nums">{data.patient.mrn}</span> · {data.visits.length} visits · {data.tracks.length} tracks · oldest visit on the left</p>
        </div>
        <div className="no-print ml-auto flex gap-2">
          {latestTwo ? (
            <Link href={compareHref(patientId, latestTwo[0].id, latestTwo[1].id)} className="inline-flex min-h-11 items-center rounded-md border border-rule-strong bg-panel px-4 font-semibold hover:bg-lagoon-50">Compare the latest two signed visits</Link>
          ) : null}
          <button type="button" onClick={() => window.print()} className="min-h-11 rounded-md border border-rule-strong bg-panel px-4 font-semibold hover:bg-lagoon-50">Print</button>
        </div>
      </header>

      <CancerCautions confirmed={summary.confirmedCancer} suspected={summary.suspectedCancer} />
      <SummaryPanel summary={summary} todayIso={todayIso} />

      <section aria-labelledby="maps-h">
        <div className="flex flex-wrap items-baseline gap-x-4">
          <h2 id="maps-h" className="text-lg font-bold">Maps by visit</h2>
          <p className="text-sm text-ink-soft" aria-live="polite">
            {selectedLabel ? <>Track <span className="font-bold">{selectedLabel}</span> is ringed on every map. <button type="button" className="no-print min-h-11 px-2 text-lagoon-700 underline" onClick={() => setSelectedTrackId(null)}>Clear</button></> : "Choose a track (in the table or on a map) to ring it on every map. Lesions are named by track; grades are after histology where a result exists."}
          </p>
        </div>
        <ol className="mt-2 flex gap-3 overflow-x-auto pb-2 print:flex-wrap print:overflow-visible" aria-label="Visits, oldest first">
          {data.visits.map((v) => (
            <li key={v.id} className="w-64 flex-none break-inside-avoid rounded-lg border border-rule bg-panel p-2 print:w-[31%]" data-visit-card={v.visitDate}>
              <p className="flex items-baseline justify-between text-sm">
                <span className="font-bold tabular-nums">{v.visitDate}</span>
                {v.status === "signed" ? <span className="text-ink-soft">Signed</span> : <span className="rounded-full border border-dashed border-ink px-2 font-semibold" title="Not signed: its findings give no status yet">Draft</span>}
              </p>
              <p className="truncate text-xs text-ink-soft">{v.examiner}</p>
              <div className="mt-1 aspect-[720/564]">
                <TrackMap lesions={byVisit.get(v.id) ?? []} convention={convention} title={`Canal map, visit of ${v.visitDate}`} selectedTrackId={selectedTrackId} onSelectTrack={setSelectedTrackId} emphasiseSelected />
              </div>
              <p className="text-xs text-ink-soft">{lesionCountWords((byVisit.get(v.id) ?? []).length)}{v.status === "signed" ? "" : " · draft: no statuses until signed"}</p>
            </li>
          ))}
        </ol>
      </section>

      <section aria-labelledby="grid-h" className="break-inside-avoid">
        <h2 id="grid-h" className="text-lg font-bold">Status of each track at each visit</h2>
        <div className="mt-2"><StatusLegend /></div>
        <div className="mt-2">
          <StatusGrid visits={data.visits} tracks={data.tracks} statuses={data.statuses} checks={data.checks} selectedTrackId={selectedTrackId} onSelectTrack={setSelectedTrackId} />
        </div>
      </section>

      <section className="break-inside-avoid"><VisitGradeChart timeline={data} /></section>
      <section className="break-inside-avoid"><MapLegend compact /></section>
    </div>
  );
}
