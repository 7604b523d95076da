"use client";
// Suggested links for lesions drawn fresh at this visit, each with its reason. The clinician
// accepts, picks another open track, or keeps the lesion as a new track.
import { useState } from "react";
import { GRADE_ENCODING } from "@/components/canal-map";
import type { LesionDto } from "@/lib/validation/lesions";
import { BTN_MAIN, BTN_PLAIN } from "./look-again";
import type { FollowUp, GhostDto } from "./use-follow-up";

interface Row { lesionId: string; lesionLabel: string; ownTrack: string | null; trackId: string | null; explanation: string | null }

function Relink({ row, open, busy, onLink, onCancel }: { row: Row; open: readonly GhostDto[]; busy: boolean; onLink: (trackId: string) => void; onCancel: () => void }) {
  const [choice, setChoice] = useState(open.find((g) => g.trackId !== row.trackId)?.trackId ?? "");
  const id = `relink-${row.lesionId}`;
  return (
    <div className="mt-1 flex flex-wrap items-center gap-2">
      <label htmlFor={id} className="text-sm font-semibold">Earlier track for {row.lesionLabel}</label>
      <select id={id} value={choice} onChange={(e) => setChoice(e.target.value)} className="min-h-11 rounded-md border border-rule-strong bg-panel px-2">
        {open.map((g) => <option key={g.trackId} value={g.trackId}>{g.trackLabel} · {GRADE_ENCODING[g.grade].label} · {g.visitDate}</option>)}
      </select>
      <button type="button" className={BTN_MAIN} disabled={busy || !choice} onClick={() => onLink(choice)}>Link</button>
      <button type="button" className={BTN_PLAIN} onClick={onCancel}>Cancel</button>
    </div>
  );
}

export function SuggestionList({ fu, lesions, readOnly }: { fu: FollowUp; lesions: readonly LesionDto[]; readOnly: boolean }) {
  const [relinking, setRelinking] = useState<string | null>(null);
  const data = fu.data;
  if (!data) return null;
  const byId = new Map(lesions.map((l) => [l.id, l]));
  const open = data.ghosts.filter((g) => !g.foundHere && !g.checkHere);
  const rows: Row[] = [
    ...data.suggestions.map((s) => ({ lesionId: s.lesionId, trackId: s.trackId, explanation: s.explanation })),
    ...data.unmatchedLesionIds.map((lesionId) => ({ lesionId, trackId: null, explanation: null })),
  ]
    .filter((r) => byId.has(r.lesionId))
    .map((r) => ({ ...r, lesionLabel: byId.get(r.lesionId)!.label, ownTrack: byId.get(r.lesionId)!.trackLabel }));
  const suggested = rows.filter((r) => r.trackId);

  const link = (r: Row, trackId: string) => {
    const t = fu.byTrack.get(trackId)?.trackLabel ?? "the earlier track";
    void fu.act({ action: "link", lesionId: r.lesionId, trackId }, `Lesion ${r.lesionLabel} linked to ${t}.`).then((ok) => ok && setRelinking(null));
  };
  const acceptAll = async () => {
    let done = 0;
    for (const r of suggested) if (await fu.act({ action: "link", lesionId: r.lesionId, trackId: r.trackId! }, "")) done += 1;
    if (done === suggested.length) fu.setNote({ tone: "ok", text: `${done} suggested link${done === 1 ? "" : "s"} accepted.` });
  };

  return (
    <section aria-labelledby="suggestions-heading" className="flex flex-col gap-2">
      <div className="flex flex-wrap items-center gap-3">
        <h3 id="suggestions-heading" className="font-bold">Lesions drawn fresh ({rows.length})</h3>
        {!readOnly && suggested.length > 0 ? <button type="button" className={BTN_MAIN} disabled={fu.busy} onClick={() => void acceptAll()}>Accept all</button> : null}
      </div>
      {rows.length === 0 ? <p className="text-sm text-ink-soft">No fresh lesion waits for a decision. A lesion drawn away from every outline starts its own track.</p> : null}
      <ul className="flex flex-col gap-2">
        {rows.map((r) => {
          const t = r.trackId ? fu.byTrack.get(r.trackId) : undefined;
          return (
            <li key={r.lesionId} data-suggestion={r.lesionLabel} className="rounded-md border border-rule bg-panel px-3 py-2">
              <p>
                <span className="font-bold">{r.lesionLabel}</span>{" "}
                {t ? <>looks like <span className="font-bold">{t.trackLabel}</span> ({GRADE_ENCODING[t.grade].label}, last seen {t.visitDate})</> : <>matches no earlier track: it is new{r.ownTrack ? ` (${r.ownTrack})` : ""}</>}
              </p>
              {r.explanation ? <p className="text-sm text-ink-soft">Why: {r.explanation}</p> : null}
              {readOnly ? null : relinking === r.lesionId ? (
                <Relink row={r} open={open} busy={fu.busy} onLink={(id) => link(r, id)} onCancel={() => setRelinking(null)} />
              ) : (
                <div className="mt-1 flex flex-wrap gap-2">
                  {r.trackId ? <button type="button" className={BTN_MAIN} disabled={fu.busy} aria-label={`Accept ${r.lesionLabel} as ${t?.trackLabel ?? "the suggested track"}`} onClick={() => link(r, r.trackId!)}>Accept</button> : null}
                  {open.length > 0 ? <button type="button" className={BTN_PLAIN} disabled={fu.busy} onClick={() => setRelinking(r.lesionId)}>{r.trackId ? "Choose another track" : "Link to an earlier track"}</button> : null}
                  <button type="button" className={BTN_PLAIN} disabled={fu.busy} aria-label={`Keep as new: ${r.lesionLabel}`} onClick={() => void fu.act({ action: "keep_new", lesionId: r.lesionId }, `Lesion ${r.lesionLabel} kept as a new track${r.ownTrack ? ` (${r.ownTrack})` : ""}.`)}>Keep as new</button>
                </div>
              )}
            </li>
          );
        })}
      </ul>
      <KeptNewList fu={fu} byId={byId} readOnly={readOnly} />
    </section>
  );
}

/** Fresh lesions already kept as new: who decided, when, and a way back while the visit is a draft. */
function KeptNewList({ fu, byId, readOnly }: { fu: FollowUp; byId: ReadonlyMap<string, LesionDto>; readOnly: boolean }) {
  const kept = (fu.data?.keptNew ?? []).filter((k) => byId.has(k.lesionId));
  if (kept.length === 0) return null;
  return (
    <ul className="flex flex-col gap-1" aria-label="Kept as new">
      {kept.map((k) => {
        const l = byId.get(k.lesionId)!;
        return (
          <li key={k.lesionId} data-kept-new={l.label} className="flex flex-wrap items-center gap-2 rounded-md border border-dashed border-rule px-3 py-1 text-sm">
            <span><span className="font-bold">{l.label}</span> kept as new{l.trackLabel ? ` (${l.trackLabel})` : ""} by {k.decidedBy}, {k.decidedAt.slice(0, 10)}</span>
            {readOnly ? null : (
              <button type="button" className={BTN_PLAIN} disabled={fu.busy} aria-label={`Undo keeping ${l.label} as new`} onClick={() => void fu.act({ action: "unkeep_new", lesionId: k.lesionId }, `Lesion ${l.label} is offered for linking again.`)}>Undo</button>
            )}
          </li>
        );
      })}
    </ul>
  );
}
