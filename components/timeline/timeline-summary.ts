// The per-patient summary at the top of the timeline, worked out from the timeline data the
// API already computed (statuses with their effective grades). Pure: data in, values out.
import { TRACK_STATUSES, type Grade, type TrackStatus } from "@/lib/domain/vocab";
import { isHsilOrWorse } from "@/lib/tracking/effective-grade";
import type { Timeline } from "./timeline-types";

export interface TrackNowRow {
  trackId: string;
  label: string;
  status: TrackStatus;
  effectiveGrade: Grade | null;
  visitDate: string;
  reason: string;
}

export interface TimelineSummary {
  countsByStatus: Record<TrackStatus, number>;
  current: TrackNowRow[];
  lastHsilOrWorse: { visitDate: string; trackLabels: string[] } | null;
  treated: { trackId: string; label: string; visitDates: string[] }[];
  /** Tracks whose latest effective grade is suspected cancer on the impression alone. */
  suspectedCancer: string[];
  /** Tracks whose latest sighting has squamous cell carcinoma on histology: confirmed, not suspected. */
  confirmedCancer: string[];
}

/**
 * Signed visits only: statuses are stored for them alone, and a draft's lesions and marks are work
 * in progress, so they count as no finding here (the timeline still shows the draft, labelled).
 */
export function summarizeTimeline(all: Timeline): TimelineSummary {
  const signed = new Set(all.visits.filter((v) => v.status === "signed").map((v) => v.id));
  const t: Timeline = {
    ...all,
    visits: all.visits.filter((v) => signed.has(v.id)),
    statuses: all.statuses.filter((x) => signed.has(x.visitId)),
    lesions: all.lesions.filter((x) => signed.has(x.visitId)),
    checks: all.checks.filter((x) => signed.has(x.visitId)),
  };
  const dateOf = new Map(t.visits.map((v) => [v.id, v.visitDate]));
  const order = new Map(t.visits.map((v, i) => [v.id, i]));
  const labelOf = new Map(t.tracks.map((x) => [x.id, x.label]));
  const countsByStatus = Object.fromEntries(TRACK_STATUSES.map((s) => [s, 0])) as Record<TrackStatus, number>;

  const latest = new Map<string, Timeline["statuses"][number]>();
  for (const s of t.statuses) {
    const prev = latest.get(s.trackId);
    if (!prev || (order.get(s.visitId) ?? -1) > (order.get(prev.visitId) ?? -1)) latest.set(s.trackId, s);
  }
  const current: TrackNowRow[] = [];
  for (const track of t.tracks) {
    const s = latest.get(track.id);
    if (!s) continue;
    countsByStatus[s.status] += 1;
    current.push({ trackId: track.id, label: track.label, status: s.status, effectiveGrade: s.effectiveGrade, visitDate: dateOf.get(s.visitId) ?? "", reason: s.reason });
  }

  // HSIL or worse from either source: a status row's effective grade or a drawn lesion's.
  const hsilDates: { date: string; trackId: string | null }[] = [];
  for (const s of t.statuses) if (s.effectiveGrade && isHsilOrWorse(s.effectiveGrade)) hsilDates.push({ date: dateOf.get(s.visitId) ?? "", trackId: s.trackId });
  for (const l of t.lesions) if (isHsilOrWorse(l.effectiveGrade)) hsilDates.push({ date: dateOf.get(l.visitId) ?? "", trackId: l.trackId });
  const lastDate = hsilDates.reduce<string | null>((m, x) => (x.date && (!m || x.date > m) ? x.date : m), null);
  const lastHsilOrWorse = lastDate
    ? { visitDate: lastDate, trackLabels: [...new Set(hsilDates.filter((x) => x.date === lastDate && x.trackId).map((x) => labelOf.get(x.trackId!) ?? "?"))].sort() }
    : null;

  const treatedDates = new Map<string, Set<string>>();
  const addTreated = (trackId: string | null, visitId: string) => {
    if (!trackId) return;
    treatedDates.set(trackId, (treatedDates.get(trackId) ?? new Set()).add(dateOf.get(visitId) ?? ""));
  };
  for (const l of t.lesions) if (l.treated) addTreated(l.trackId, l.visitId);
  for (const c of t.checks) if (c.outcome === "treated") addTreated(c.trackId, c.visitId);
  const treated = [...treatedDates].map(([trackId, dates]) => ({ trackId, label: labelOf.get(trackId) ?? "?", visitDates: [...dates].sort() }))
    .sort((a, b) => a.label.localeCompare(b.label, "en", { numeric: true }));

  // Histology decides (LAST): SCC on a biopsy of the track's latest sighting confirms the cancer.
  const sccAt = new Set(t.lesions.filter((l) => l.histology === "scc" && l.trackId).map((l) => `${l.trackId}|${l.visitId}`));
  const cancer = current.filter((c) => c.effectiveGrade === "suspected_cancer");
  const isConfirmed = (c: TrackNowRow) => sccAt.has(`${c.trackId}|${latest.get(c.trackId)?.visitId}`);
  const confirmedCancer = cancer.filter(isConfirmed).map((c) => c.label);
  const suspectedCancer = cancer.filter((c) => !isConfirmed(c)).map((c) => c.label);
  return { countsByStatus, current, lastHsilOrWorse, treated, suspectedCancer, confirmedCancer };
}

/**
 * Whole months and days between two ISO dates, in words ("1 year 2 months", "12 days", "today");
 * null when `from` is later than `to`, for the caller to say so in its own sentence.
 */
export function timeSinceWords(fromIso: string, toIso: string): string | null {
  const from = new Date(`${fromIso}T00:00:00Z`);
  const to = new Date(`${toIso}T00:00:00Z`);
  if (to < from) return null;
  let months = (to.getUTCFullYear() - from.getUTCFullYear()) * 12 + (to.getUTCMonth() - from.getUTCMonth());
  if (to.getUTCDate() < from.getUTCDate()) months -= 1;
  if (months < 1) {
    const days = Math.round((to.getTime() - from.getTime()) / 86_400_000);
    return days === 0 ? "today" : `${days} ${days === 1 ? "day" : "days"}`;
  }
  const y = Math.floor(months / 12);
  const m = months % 12;
  const part = (k: number, w: string) => (k ? `${k} ${w}${k === 1 ? "" : "s"}` : "");
  return [part(y, "year"), part(m, "month")].filter(Boolean).join(" ");
}
