"use client";
// Under the map at a follow-up visit: every earlier track to look for again, and the fresh
// lesions waiting for a link. Read-only visits show the same marks without the actions.
import type { DisplayConvention } from "@/lib/geometry";
import type { LesionDto } from "@/lib/validation/lesions";
import { BTN_PLAIN, LookAgainItem } from "./look-again";
import { SuggestionList } from "./suggestion-list";
import type { FollowUp } from "./use-follow-up";
import type { LookAgain } from "./use-look-again";

export interface FollowUpPanelProps {
  fu: FollowUp;
  look: LookAgain;
  lesions: readonly LesionDto[];
  conv: DisplayConvention;
  readOnly: boolean;
  selectedTrackId: string | null;
  onSelectTrack: (trackId: string) => void;
}

export function ActionNoteLine({ fu }: { fu: FollowUp }) {
  if (!fu.note || !fu.note.text) return null;
  const danger = fu.note.tone === "danger";
  return (
    <div role={danger ? "alert" : "status"} className={`flex items-start gap-2 rounded-md border-l-4 px-3 py-2 text-sm ${danger ? "border-danger-rule bg-danger-bg text-danger-ink" : "border-lagoon-600 bg-lagoon-50"}`}>
      <p className="flex-1 font-semibold" data-follow-up-note>{fu.note.text}</p>
      <button type="button" className={BTN_PLAIN} onClick={fu.clearNote}>Dismiss</button>
    </div>
  );
}

export function FollowUpPanel({ fu, look, lesions, conv, readOnly, selectedTrackId, onSelectTrack }: FollowUpPanelProps) {
  const ghosts = fu.data?.ghosts ?? [];
  if (fu.error) return <p role="status" className="text-sm text-ink-soft">Earlier tracks could not be loaded: {fu.error.message}</p>;
  if (!fu.data || ghosts.length === 0) return null;
  const left = ghosts.filter((g) => !g.foundHere && !g.checkHere).length;
  return (
    <section aria-labelledby="look-again-heading" className="rounded-lg border border-rule bg-paper p-3" data-follow-up>
      <div className="flex flex-wrap items-baseline gap-x-3">
        <h2 id="look-again-heading" className="text-lg font-bold">Look again: earlier tracks ({ghosts.length})</h2>
        <span className="text-sm text-ink-soft" role="status">{left === 0 ? "Every earlier track has been accounted for." : `${left} still to look for.`}</span>
      </div>
      <p className="text-sm text-ink-soft">
        Dashed outlines on the map mark where each track was last seen. Tap an outline&apos;s label to pick it.
      </p>
      {selectedTrackId ? null : <div className="mt-2"><ActionNoteLine fu={fu} /></div>}
      <div className="mt-2 grid gap-4 lg:grid-cols-2">
        <ul className="flex flex-col gap-2" aria-label="Earlier tracks">
          {ghosts.map((g) => (
            <LookAgainItem
              key={g.trackId}
              ghost={g}
              conv={conv}
              readOnly={readOnly}
              busy={fu.busy}
              selected={g.trackId === selectedTrackId}
              foundAs={look.foundAsByTrack.get(g.trackId) ?? null}
              suggestion={look.suggestionByTrack.get(g.trackId) ?? null}
              onSelect={onSelectTrack}
              onFound={look.onFound}
              onCheck={look.onCheck}
              onUncheck={look.onUncheck}
            />
          ))}
        </ul>
        <SuggestionList fu={fu} lesions={lesions} readOnly={readOnly} />
      </div>
    </section>
  );
}

/** The inspector's view of a tapped outline: the same item, with its actions next to the map. */
export function GhostCard({ fu, look, conv, readOnly, trackId, onClose }: { fu: FollowUp; look: LookAgain; conv: DisplayConvention; readOnly: boolean; trackId: string; onClose: () => void }) {
  const g = fu.byTrack.get(trackId);
  if (!g) return null;
  return (
    <div data-ghost-card={g.trackLabel} className="flex flex-col gap-2">
      <h3 className="font-bold">Earlier track {g.trackLabel}</h3>
      <ActionNoteLine fu={fu} />
      <ul>
        <LookAgainItem
          ghost={g}
          conv={conv}
          readOnly={readOnly}
          busy={fu.busy}
          selected
          foundAs={look.foundAsByTrack.get(g.trackId) ?? null}
          suggestion={look.suggestionByTrack.get(g.trackId) ?? null}
          onSelect={() => undefined}
          onFound={look.onFound}
          onCheck={look.onCheck}
          onUncheck={look.onUncheck}
        />
      </ul>
      <button type="button" className={`${BTN_PLAIN} self-start`} onClick={onClose}>Close</button>
    </div>
  );
}
