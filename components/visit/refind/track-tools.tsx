"use client";
// The selected lesion's track: which one it continues, and split / merge when the suggestion
// or an earlier choice was wrong. The server refuses to merge two tracks seen at one visit.
import { useState } from "react";
import type { LesionDto } from "@/lib/validation/lesions";
import { BTN_PLAIN } from "./look-again";
import type { FollowUp } from "./use-follow-up";

export function TrackTools({ fu, lesion, lesions, readOnly }: { fu: FollowUp; lesion: LesionDto; lesions: readonly LesionDto[]; readOnly: boolean }) {
  const [into, setInto] = useState("");
  if (!lesion.trackId || lesion.id.startsWith("tmp-")) return null;
  const earlier = fu.byTrack.get(lesion.trackId);
  // Every other track of this patient that the screen knows: earlier ones and this visit's.
  const others = new Map<string, string>();
  for (const g of fu.data?.ghosts ?? []) others.set(g.trackId, `${g.trackLabel} · last seen ${g.visitDate}`);
  for (const l of lesions) if (l.trackId && l.trackLabel && !others.has(l.trackId)) others.set(l.trackId, `${l.trackLabel} · lesion ${l.label} here`);
  others.delete(lesion.trackId);
  const chosen = others.has(into) ? into : "";
  const selectId = `merge-${lesion.id}`;
  return (
    <section aria-label={`Track of lesion ${lesion.label}`} className="mt-4 border-t border-rule pt-3">
      <h3 className="font-bold">Track {lesion.trackLabel ?? ""}</h3>
      <p className="text-sm text-ink-soft">
        {earlier ? `Continues ${earlier.trackLabel}, last seen ${earlier.visitDate} as ${earlier.label}.` : "Starts at this visit (a new track)."}
      </p>
      {readOnly ? null : (
        <div className="mt-2 flex flex-col gap-2">
          {earlier ? (
            <button type="button" className={`${BTN_PLAIN} self-start`} disabled={fu.busy} onClick={() => void fu.act({ action: "split", lesionId: lesion.id }, `Lesion ${lesion.label} split off ${earlier.trackLabel}: it now has a track of its own.`)}>
              Split off as a new track
            </button>
          ) : null}
          {others.size > 0 ? (
            <div className="flex flex-wrap items-center gap-2">
              <label htmlFor={selectId} className="text-sm font-semibold">Merge {lesion.trackLabel} into</label>
              <select id={selectId} value={chosen} onChange={(e) => setInto(e.target.value)} className="min-h-11 rounded-md border border-rule-strong bg-panel px-2">
                <option value="">Choose a track…</option>
                {[...others].map(([id, words]) => <option key={id} value={id}>{words}</option>)}
              </select>
              <button
                type="button"
                className={BTN_PLAIN}
                disabled={fu.busy || !chosen}
                onClick={() => void fu.act({ action: "merge", trackId: lesion.trackId!, intoTrackId: chosen }, `${lesion.trackLabel} merged into ${others.get(chosen)?.split(" · ")[0] ?? "the chosen track"}.`).then((ok) => ok && setInto(""))}
              >
                Merge
              </button>
            </div>
          ) : null}
        </div>
      )}
    </section>
  );
}
