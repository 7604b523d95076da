"use client";
// One earlier track to look for again: what it was, where, when last seen, and what was
// decided here. Used in the list under the map and in the inspector when its outline is tapped.
import { memo } from "react";
import { GRADE_ENCODING } from "@/components/canal-map";
import { describeSite, type DisplayConvention } from "@/lib/geometry";
import type { CheckOutcome, GhostDto, SuggestionDto } from "./use-follow-up";

export const BTN = "min-h-11 min-w-11 rounded-md px-3 font-semibold disabled:opacity-50";
export const BTN_MAIN = `${BTN} bg-lagoon-600 text-white hover:bg-lagoon-700`;
export const BTN_PLAIN = `${BTN} border border-rule-strong bg-panel text-ink hover:bg-lagoon-50`;
/** A decision that has been made: filled, with a tick, so it does not rely on colour alone. */
export const BTN_PRESSED = `${BTN} border border-lagoon-700 bg-lagoon-600 text-white`;

/** The three decisions on an earlier track at this visit; none is chosen until the examiner chooses. */
const DECISIONS: readonly (readonly ["found" | CheckOutcome, string])[] = [["found", "Found"], ["not_found", "Not found"], ["treated", "Treated"], ["not_examined", "Not examined"]];

/** The mark made at this visit, in words a clinician would say. */
export function ghostStatusWords(g: Pick<GhostDto, "foundHere" | "checkHere">, foundAs?: string | null): string {
  if (g.foundHere) return foundAs ? `Found here as ${foundAs}` : "Found here";
  if (g.checkHere === "not_found") return "Not found at this visit";
  if (g.checkHere === "treated") return "Marked treated at this visit";
  if (g.checkHere === "not_examined") return "Not examined at this visit (not counted as clear)";
  return "Still to look for";
}

export interface LookAgainItemProps {
  ghost: GhostDto;
  conv: DisplayConvention;
  readOnly: boolean;
  busy: boolean;
  selected: boolean;
  /** Label of this visit's lesion on the track, once found. */
  foundAs: string | null;
  /** A fresh lesion suggested for this track, with its label. */
  suggestion: (SuggestionDto & { lesionLabel: string }) | null;
  onSelect: (trackId: string) => void;
  onFound: (g: GhostDto) => void;
  onCheck: (g: GhostDto, outcome: CheckOutcome) => void;
  onUncheck: (g: GhostDto) => void;
}

function LookAgainItemInner(p: LookAgainItemProps) {
  const g = p.ghost;
  const enc = GRADE_ENCODING[g.grade];
  const open = !g.foundHere && !g.checkHere;
  const state = g.foundHere ? "found" : (g.checkHere ?? "open");
  return (
    <li
      data-look-again={g.trackLabel}
      data-state={state}
      aria-current={p.selected || undefined}
      className={`rounded-md border px-3 py-2 ${p.selected ? "border-lagoon-600 bg-lagoon-50" : "border-rule bg-panel"} ${open ? "" : "border-dashed"}`}
    >
      <div className="flex flex-wrap items-baseline gap-x-3">
        <button type="button" onClick={() => p.onSelect(g.trackId)} className="min-h-11 min-w-11 rounded-md text-left font-bold underline-offset-2 hover:underline" aria-pressed={p.selected}>
          {g.trackLabel}
        </button>
        <span data-ghost-grade>
          <span aria-hidden="true" className="mr-1 inline-block size-3 rounded-full" style={{ background: enc.hue }} />
          {enc.label}
          {g.histology ? <span className="text-ink-soft"> (histology{g.impression !== g.grade ? `; impression ${GRADE_ENCODING[g.impression].label}` : ""})</span> : null}
        </span>
        <span className="text-ink-soft">last seen {g.visitDate} as {g.label}</span>
      </div>
      <p className="text-sm">{describeSite(g.clockStartH, g.clockEndH, g.distanceStartCm, g.distanceEndCm, p.conv)}</p>
      <p className={`text-sm font-semibold ${open ? "text-ink-soft" : "text-ink"}`} data-ghost-status>
        {open ? "○ " : g.foundHere ? "● " : "✕ "}
        {ghostStatusWords(g, p.foundAs)}
      </p>
      {p.readOnly ? null : (
        <div className="mt-1 flex flex-wrap items-center gap-2">
          <div role="group" aria-label={`Decision on ${g.trackLabel}`} className="flex flex-wrap gap-2">
            {DECISIONS.map(([key, words]) => {
              const pressed = state === key;
              // Once a lesion here continues the track, "not found" or "treated" cannot also be true.
              const blocked = g.foundHere && !pressed;
              const choose = () => {
                if (key === "found") { if (!pressed) p.onFound(g); }
                else if (pressed) p.onUncheck(g);
                else p.onCheck(g, key);
              };
              return (
                <button key={key} type="button" disabled={p.busy || blocked} aria-pressed={pressed} className={pressed ? BTN_PRESSED : BTN_PLAIN} aria-label={`${words} ${g.trackLabel}`} onClick={choose}>
                  {pressed ? <span aria-hidden="true">✓ </span> : null}{words}
                </button>
              );
            })}
          </div>
          {g.checkHere ? <button type="button" disabled={p.busy} className={BTN_PLAIN} aria-label={`Undo the mark on ${g.trackLabel}`} onClick={() => p.onUncheck(g)}>Undo</button> : null}
          {open ? (
            <span className="text-sm text-ink-soft">
              {p.suggestion ? `Found links lesion ${p.suggestion.lesionLabel}, drawn here.` : "Found draws a lesion at the earlier place."}
            </span>
          ) : null}
        </div>
      )}
    </li>
  );
}

export const LookAgainItem = memo(LookAgainItemInner);
