// A patient's track histories from the rows the history statement reads: one observation per
// track and signed visit. A draft is work in progress: it neither clears nor finds anything until
// it is signed, so it takes no part in statuses (nor in the summaries behind the metachronous flag).
// At a signed visit, a track without a lesion there was looked for and not found, unless the
// examiner marked it "not examined" (no status, never cleared). Signing now asks for a decision on
// every earlier track (lib/server/signing.ts); a visit signed before that asked keeps the old rule.
import { HISTOLOGY, type Grade, type Histology, type TrackCheckOutcome, type VisitStatus } from "@/lib/domain/vocab";
import type { TrackHistory } from "./patient-summary";

export interface HistoryRows {
  visits: { id: string; visitDate: string; status: VisitStatus }[];
  tracks: { id: string; label: string }[];
  lesions: { id: string; visitId: string; trackId: string; grade: Grade }[];
  biopsies: { lesionId: string | null; histology: Histology | null }[];
  treatments: { lesionId: string | null; visitId: string }[];
  checks: { visitId: string; trackId: string; outcome: TrackCheckOutcome }[];
}

const HISTOLOGY_RANK = Object.fromEntries(HISTOLOGY.map((h, i) => [h, i])) as Record<Histology, number>;

/** Of two results, the worse (HISTOLOGY runs from benign to carcinoma); null counts as no result. */
export function worseHistology(a: Histology | null | undefined, b: Histology | null | undefined): Histology | null {
  if (!a) return b ?? null;
  if (!b) return a;
  return HISTOLOGY_RANK[b] > HISTOLOGY_RANK[a] ? b : a;
}

/** The worst of a lesion's biopsy results: the worst decides its grade. */
export function worstHistology(results: readonly (Histology | null | undefined)[]): Histology | null {
  return results.reduce<Histology | null>((worst, h) => worseHistology(worst, h), null);
}

/** The worst histology among each lesion's biopsies (the worst decides). */
export function worstHistologyByLesion(rows: readonly { lesionId: string | null; histology: Histology | null }[]): Map<string, Histology> {
  const out = new Map<string, Histology>();
  for (const b of rows) {
    if (!b.lesionId || !b.histology) continue;
    out.set(b.lesionId, worseHistology(out.get(b.lesionId), b.histology)!);
  }
  return out;
}

export function trackHistoriesOf(h: HistoryRows): TrackHistory[] {
  if (!h.visits.some((v) => v.status === "signed") || h.tracks.length === 0) return [];
  const histologyByLesion = worstHistologyByLesion(h.biopsies);
  const treatedLesions = new Set(h.treatments.map((t) => t.lesionId).filter(Boolean));
  const lesionAt = new Map<string, HistoryRows["lesions"][number]>();
  for (const l of h.lesions) lesionAt.set(`${l.trackId}|${l.visitId}`, l);
  const checkAt = new Map(h.checks.map((c) => [`${c.trackId}|${c.visitId}`, c.outcome]));

  const signed = h.visits.filter((v) => v.status === "signed");
  return h.tracks.map((t) => ({
    trackId: t.id,
    label: t.label,
    observations: signed.map((v) => {
      const l = lesionAt.get(`${t.id}|${v.id}`);
      const check = checkAt.get(`${t.id}|${v.id}`);
      if (l) {
        return { visitId: v.id, visitDate: v.visitDate, seen: true, lookedFor: true, impressionGrade: l.grade, histology: histologyByLesion.get(l.id) ?? null, treatedAtVisit: treatedLesions.has(l.id) };
      }
      return { visitId: v.id, visitDate: v.visitDate, seen: false, lookedFor: check !== "not_examined", treatedAtVisit: check === "treated" };
    }),
  }));
}
