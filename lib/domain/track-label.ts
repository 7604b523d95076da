// Track labels name one lesion followed across visits. They are "#1", "#2"…: a bare "T1" reads as a
// TNM tumour category in an anal-cancer clinic, letters are already biopsy specimen labels (A, B…)
// and bare numbers clash with the clock numbers on the map.

export const TRACK_LABEL_PREFIX = "#";

/** The label of the patient's n-th track (n from 1). */
export function trackLabel(n: number): string {
  return `${TRACK_LABEL_PREFIX}${n}`;
}

/** The number behind a label, or null for a label of another form. */
export function trackLabelNumber(label: string): number | null {
  const m = /^#([0-9]+)$/.exec(label);
  return m ? Number(m[1]) : null;
}

/** The label after the highest numbered one among a patient's labels. */
export function nextTrackLabel(existing: readonly string[]): string {
  return trackLabel(existing.reduce((m, l) => Math.max(m, trackLabelNumber(l) ?? 0), 0) + 1);
}
