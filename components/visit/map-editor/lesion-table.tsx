"use client";
import { memo } from "react";
import { GRADE_ENCODING, ZONE_ENCODING } from "@/components/canal-map";
import { formatClock, isFullCircle, toDisplayHours, type DisplayConvention } from "@/lib/geometry";
import { numberingSuffix } from "@/components/visit/numbering";
import type { LesionDto } from "@/lib/validation/lesions";
import type { SaveInfo } from "./use-lesion-store";

const zoneLabel = (z: string) => ZONE_ENCODING.find((e) => e.zone === z)?.label ?? "—";
const cm = (n: number) => `${Math.round(n * 10) / 10}`;

/** One lesion's row; memoised, so a new selection redraws two rows, not all of them. */
const Row = memo(function Row({ l, conv, on, s, onSelect }: { l: LesionDto; conv: DisplayConvention; on: boolean; s: SaveInfo | undefined; onSelect: (id: string) => void }) {
  return (
    <tr aria-selected={on} onClick={() => onSelect(l.id)} className={`cursor-pointer border-b border-rule last:border-0 ${on ? "bg-lagoon-100" : "hover:bg-lagoon-50"}`}>
      <td className="px-2 py-1">
        <button type="button" onClick={(e) => { e.stopPropagation(); onSelect(l.id); }} className="min-h-11 min-w-11 rounded-md font-bold underline-offset-2 hover:underline" aria-pressed={on}>
          {l.label}
        </button>
      </td>
      <td className="px-2 py-1" data-track-cell>{l.trackLabel ?? "—"}</td>
      <td className="px-2 py-1">
        <span aria-hidden="true" className="mr-1 inline-block size-3 rounded-full" style={{ background: GRADE_ENCODING[l.grade].hue }} />
        {GRADE_ENCODING[l.grade].label}
      </td>
      <td className="px-2 py-1 tabular-nums">{isFullCircle({ startH: l.clockStartH, endH: l.clockEndH }) ? "Whole circumference" : <>{formatClock(toDisplayHours(l.clockStartH, conv))} → {formatClock(toDisplayHours(l.clockEndH, conv))}</>}</td>
      <td className="px-2 py-1 tabular-nums">{cm(l.distanceStartCm)} to {cm(l.distanceEndCm)}</td>
      <td className="px-2 py-1">{zoneLabel(l.zone)}</td>
      <td className="px-2 py-1">{l.biopsyLabels.join(", ") || "—"}{l.treated ? " · treated" : ""}</td>
      <td className={`px-2 py-1 ${s?.state === "failed" ? "font-semibold text-danger-ink" : "text-ink-soft"}`}>{s?.state === "failed" ? "Not saved" : s?.state === "saving" || l.version === 0 ? "Saving…" : "Saved"}</td>
    </tr>
  );
});

/** All lesions of the visit; selecting a row selects on the map and back. */
function LesionTableInner({ lesions, conv, selectedId, status, onSelect }: { lesions: readonly LesionDto[]; conv: DisplayConvention; selectedId: string | null; status: Readonly<Record<string, SaveInfo | undefined>>; onSelect: (id: string) => void }) {
  return (
    // Fixed layout: a change of numbering rewrites every clock cell, and an auto-layout table
    // would measure all 1,600 cells again to size its columns.
    <table className="w-full table-fixed border-collapse rounded-lg bg-panel text-left text-sm">
      <colgroup>
        <col className="w-[9%]" /><col className="w-[9%]" /><col className="w-[17%]" /><col className="w-[16%]" /><col className="w-[12%]" /><col className="w-[15%]" /><col className="w-[12%]" /><col className="w-[10%]" />
      </colgroup>
      <caption className="py-1 text-left font-bold">Lesions at this visit ({lesions.length})</caption>
      <thead className="border-b border-rule bg-lagoon-50">
        <tr><th className="px-2 py-2">Lesion</th><th className="px-2 py-2">Track</th><th className="px-2 py-2">Impression</th><th className="px-2 py-2">Clock ({numberingSuffix(conv)})</th><th className="px-2 py-2">cm from verge</th><th className="px-2 py-2">Zone</th><th className="px-2 py-2">Biopsy</th><th className="px-2 py-2">State</th></tr>
      </thead>
      <tbody>
        {lesions.map((l) => (
          <Row key={l.id} l={l} conv={conv} on={l.id === selectedId} s={status[l.id]} onSelect={onSelect} />
        ))}
        {lesions.length === 0 ? <tr><td colSpan={8} className="px-2 py-4 text-center text-ink-soft">No lesions recorded yet.</td></tr> : null}
      </tbody>
    </table>
  );
}

export const LesionTable = memo(LesionTableInner);
