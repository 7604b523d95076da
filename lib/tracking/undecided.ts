// Which earlier tracks still wait for a decision at a visit. Every track seen at an earlier visit
// is looked for again: at this visit it is found (a lesion here continues it) or marked (not
// found, treated, not examined). One still undecided when the visit is signed would otherwise be
// read as looked for and not found, and so count as clear: signing is refused until each has a
// decision (lib/server/signing.ts), and the screen lists them (components/visit/record).
import type { TrackCheckOutcome } from "@/lib/domain/vocab";

export interface EarlierTrack {
  trackId: string;
  label: string;
}

/** Earlier tracks with neither a lesion nor a mark at this visit, in label order (#1, #2, … #10). */
export function undecidedTracks<T extends EarlierTrack>(
  earlier: readonly T[],
  foundHere: Iterable<string | null>,
  checksHere: readonly { trackId: string; outcome: TrackCheckOutcome }[],
): T[] {
  const decided = new Set<string | null>(foundHere);
  for (const c of checksHere) decided.add(c.trackId);
  const seen = new Set<string>();
  return earlier
    .filter((t) => !decided.has(t.trackId) && !seen.has(t.trackId) && seen.add(t.trackId))
    .sort((a, b) => a.label.localeCompare(b.label, "en", { numeric: true }));
}

/** The refusal's words: which tracks, and the three answers the examiner can give. */
export function undecidedMessage(labels: readonly string[]): string {
  const list = labels.join(", ");
  const one = labels.length === 1;
  return `Before signing, decide on ${one ? "the earlier track" : "each earlier track"} still to look for (${list}): found, not found or not examined. ${
    one ? "It is" : "They are"
  } not counted as clear until then.`;
}
