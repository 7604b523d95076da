"use client";

import { GRADE_LABEL, type Grade, type TrackCheckOutcome, type TrackStatus } from "@/lib/domain/vocab";
import { CHECK_WORDS } from "@/lib/domain/labels";
import { STATUS_LABEL, StatusMark } from "./status-glyph";

export interface GridVisit {
  id: string;
  visitDate: string;
  /** A draft's column is labelled as such: it has no statuses until signed. */
  status?: "draft" | "signed";
}
export interface GridTrack {
  id: string;
  label: string;
}
export interface GridStatus {
  trackId: string;
  visitId: string;
  status: TrackStatus;
  effectiveGrade: Grade | null;
  reason: string;
}
export interface GridCheck {
  trackId: string;
  visitId: string;
  outcome: TrackCheckOutcome;
}

/**
 * Tracks down, visits across (oldest left): a real table, so a screen reader announces the
 * track and the visit with every cell. The reason from the status rules is read out too.
 */
export function StatusGrid(props: {
  visits: readonly GridVisit[];
  tracks: readonly GridTrack[];
  statuses: readonly GridStatus[];
  checks?: readonly GridCheck[];
  selectedTrackId: string | null;
  onSelectTrack: (trackId: string | null) => void;
}) {
  const { visits, tracks, statuses, checks = [], selectedTrackId, onSelectTrack } = props;
  const byCell = new Map(statuses.map((s) => [`${s.trackId}|${s.visitId}`, s]));
  const checkByCell = new Map(checks.map((c) => [`${c.trackId}|${c.visitId}`, c.outcome]));
  return (
    <div className="overflow-x-auto rounded-lg border border-rule bg-panel print:overflow-visible">
      <table className="w-full border-collapse text-left text-sm">
        <caption className="sr-only">Status of each track at each visit, oldest visit first. Each cell gives the status, the grade and the reason.</caption>
        <thead className="border-b border-rule bg-lagoon-50">
          <tr>
            <th scope="col" className="sticky left-0 bg-lagoon-50 px-3 py-2">Track</th>
            {visits.map((v) => (
              <th key={v.id} scope="col" className="whitespace-nowrap px-3 py-2 tabular-nums">
                {v.visitDate}
                {v.status === "draft" ? <span className="block text-xs font-normal"> draft, not signed</span> : null}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {tracks.map((t) => {
            const selected = t.id === selectedTrackId;
            return (
              <tr key={t.id} className={`border-b border-rule last:border-0 ${selected ? "bg-lagoon-50" : ""}`} data-track-row={t.label}>
                <th scope="row" className={`sticky left-0 px-1 py-1 ${selected ? "bg-lagoon-50" : "bg-panel"}`}>
                  <button
                    type="button"
                    aria-pressed={selected}
                    onClick={() => onSelectTrack(selected ? null : t.id)}
                    className={`min-h-11 min-w-14 rounded-md px-2 font-bold ${selected ? "bg-lagoon-600 text-white" : "text-lagoon-700 underline hover:bg-lagoon-50"}`}
                  >
                    {t.label}
                    <span className="sr-only">{selected ? ", shown on every map" : ", show on every map"}</span>
                  </button>
                </th>
                {visits.map((v) => {
                  const s = byCell.get(`${t.id}|${v.id}`);
                  const check = checkByCell.get(`${t.id}|${v.id}`);
                  const gradeWords = s?.effectiveGrade ? GRADE_LABEL[s.effectiveGrade] : null;
                  const title = s
                    ? `${STATUS_LABEL[s.status]}${gradeWords ? `, ${gradeWords}` : ""}: ${s.reason}`
                    : v.status === "draft" ? "No status: the visit is a draft" : check ? `No status: ${CHECK_WORDS[check]}` : "No record at this visit";
                  return (
                    <td key={v.id} title={title} data-status={s?.status ?? "none"} className="px-3 py-2 align-top">
                      {!s && v.status === "draft" ? <span className="text-ink-soft">Draft: no status yet</span> : <StatusMark status={s?.status ?? null} />}
                      {gradeWords ? <span className="block text-xs text-ink-soft">{gradeWords}</span> : null}
                      {check && !s ? <span className="block text-xs text-ink-soft">{CHECK_WORDS[check]}</span> : null}
                      {s ? <span className="sr-only">. {s.reason}</span> : null}
                    </td>
                  );
                })}
              </tr>
            );
          })}
          {tracks.length === 0 ? (
            <tr><td colSpan={visits.length + 1} className="px-3 py-6 text-center text-ink-soft">No lesions have been recorded for this patient.</td></tr>
          ) : null}
        </tbody>
      </table>
    </div>
  );
}
