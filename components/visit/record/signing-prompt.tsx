"use client";
// Before a follow-up visit is signed: every earlier track still to look for, each with its own
// decision (found, not found, not examined). The server refuses to sign while one is undecided
// (lib/server/signing.ts); the list here is the same rule (lib/tracking/undecided.ts) on the
// visit's follow-up context, and its actions are the Look again list's (use-look-again.ts).
import useSWR from "swr";
import { fetcher } from "@/components/data/fetcher";
import { GRADE_ENCODING } from "@/components/canal-map";
import { Caution } from "@/components/ui/caution";
import { CHECK_WORDS } from "@/lib/domain/labels";
import { describeSite, type DisplayConvention } from "@/lib/geometry";
import { undecidedTracks } from "@/lib/tracking/undecided";
import type { LesionDto } from "@/lib/validation/lesions";
import { BTN_MAIN, BTN_PLAIN } from "@/components/visit/refind/look-again";
import { lesionsKey, useFollowUp, type GhostDto } from "@/components/visit/refind/use-follow-up";
import { useLookAgain } from "@/components/visit/refind/use-look-again";

const EMPTY: LesionDto[] = [];

export function SigningPrompt(props: { visitId: string; conv: DisplayConvention; busy: boolean; onSign: () => void; onCancel: () => void }) {
  const fu = useFollowUp(props.visitId);
  const lesions = useSWR<{ lesions: LesionDto[] }>(lesionsKey(props.visitId), fetcher).data?.lesions ?? EMPTY;
  const look = useLookAgain(fu, lesions);
  if (!fu.data) return <p role="status" className="text-sm text-ink-soft">{fu.error ? `Earlier tracks could not be read: ${fu.error.message}` : "Checking earlier tracks…"}</p>;

  const ghosts = fu.data.ghosts;
  const checks = ghosts.flatMap((g) => (g.checkHere ? [{ trackId: g.trackId, outcome: g.checkHere }] : []));
  const open = undecidedTracks(ghosts.map((g) => ({ ...g, label: g.trackLabel })), ghosts.filter((g) => g.foundHere).map((g) => g.trackId), checks);
  const decided = ghosts.filter((g) => g.foundHere || g.checkHere);
  const busy = props.busy || fu.busy;
  const decidedWords = (g: GhostDto) => (g.foundHere ? `found (${look.foundAsByTrack.get(g.trackId) ?? "lesion here"})` : CHECK_WORDS[g.checkHere!]);

  return (
    <div className="flex flex-col gap-3" data-signing-prompt>
      {open.length ? (
        <section aria-labelledby="undecided-h" className="flex flex-col gap-2">
          <h3 id="undecided-h" className="font-bold">Before signing: {open.length === 1 ? "1 earlier track is" : `${open.length} earlier tracks are`} still to look for</h3>
          <Caution title="Decide on each earlier track for this visit">
            A track left undecided would be read as looked for and not found, which after treatment counts as cleared.
            “Not examined” records that the site was not looked at: the track gets no status at this visit and is not counted as clear.
          </Caution>
          <ul className="flex flex-col gap-2">
            {open.map((g) => {
              const enc = GRADE_ENCODING[g.grade];
              const s = look.suggestionByTrack.get(g.trackId);
              return (
                <li key={g.trackId} data-undecided={g.trackLabel} className="rounded-md border border-rule px-3 py-2">
                  <p>
                    <span className="font-bold">{g.trackLabel}</span>{" "}
                    <span aria-hidden="true" className="mx-1 inline-block size-3 rounded-full" style={{ background: enc.hue }} />
                    {enc.label} · last seen {g.visitDate} as {g.label} · {describeSite(g.clockStartH, g.clockEndH, g.distanceStartCm, g.distanceEndCm, props.conv)}
                  </p>
                  <div className="mt-1 flex flex-wrap items-center gap-2" role="group" aria-label={`Decision for ${g.trackLabel}`}>
                    <button type="button" disabled={busy} className={BTN_PLAIN} aria-label={`Found ${g.trackLabel}`} onClick={() => look.onFound(g)}>Found</button>
                    <button type="button" disabled={busy} className={BTN_PLAIN} aria-label={`Not found ${g.trackLabel}`} onClick={() => look.onCheck(g, "not_found")}>Not found</button>
                    <button type="button" disabled={busy} className={BTN_PLAIN} aria-label={`Not examined ${g.trackLabel}`} onClick={() => look.onCheck(g, "not_examined")}>Not examined</button>
                    <span className="text-sm text-ink-soft">{s ? `Found links lesion ${s.lesionLabel}, drawn here.` : "Found draws a lesion at the earlier place: adjust it on the map."}</span>
                  </div>
                </li>
              );
            })}
          </ul>
        </section>
      ) : null}
      {decided.length ? (
        <p className="text-sm" data-decided>
          Decided at this visit: {decided.map((g) => `${g.trackLabel} ${decidedWords(g)}`).join("; ")}. Change a decision in the Look again list under the map.
        </p>
      ) : null}
      {fu.note ? <p role="status" className={`text-sm ${fu.note.tone === "danger" ? "font-semibold text-danger-ink" : ""}`}>{fu.note.text}</p> : null}
      <div className="flex flex-wrap gap-3">
        <button type="button" className={BTN_MAIN} onClick={props.onSign} disabled={busy || open.length > 0}>
          {props.busy ? "Signing…" : "Yes, sign this visit"}
        </button>
        <button type="button" className={BTN_PLAIN} onClick={props.onCancel}>Not yet</button>
        {open.length ? <span className="self-center text-sm font-semibold">Signing waits for a decision on {open.map((g) => g.trackLabel).join(", ")}.</span> : null}
      </div>
    </div>
  );
}
