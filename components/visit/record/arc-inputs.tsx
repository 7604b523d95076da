"use client";
import { Button } from "@/components/ui/button";
import { formatClock, fromDisplayHours, fullCircle, isFullCircle, sectorName, toDisplayHours, type DisplayConvention } from "@/lib/geometry";
import { numberingSuffix } from "@/components/visit/numbering";
import { inputClass } from "./field";

/** One arc as typed: clock numbers in the viewer's display convention, 1–12; or the whole circumference. */
export interface ArcDraft { start: string; end: string; whole?: boolean }

const hourOk = (s: string) => s !== "" && Number(s) > 0 && Number(s) <= 12;

/** Typed display hours → stored-frame arcs, or null while any number is missing or out of range. */
export function toStoredArcs(all: ArcDraft[], conv: DisplayConvention) {
  // A row left wholly blank is no arc at all (a treatment of a named lesion may have none).
  const drafts = all.filter((d) => d.whole || d.start !== "" || d.end !== "");
  if (!drafts.every((d) => d.whole || (hourOk(d.start) && hourOk(d.end)))) return null;
  // The whole circumference is stored 0 → 12 in every convention (lib/geometry/arcs.ts).
  return drafts.map((d) => (d.whole ? fullCircle() : { startH: fromDisplayHours(Number(d.start), conv), endH: fromDisplayHours(Number(d.end), conv) }));
}

/** A stored arc as the form types it: display hours, 12 o'clock written 12 (the inverse of toStoredArcs). */
export function toArcDraft(a: { startH: number; endH: number }, conv: DisplayConvention): ArcDraft {
  if (isFullCircle(a)) return { start: "", end: "", whole: true };
  const typed = (h: number) => { const d = Math.round(toDisplayHours(h, conv) * 100) / 100; return String(d === 0 || d === 12 ? 12 : d); };
  return { start: typed(a.startH), end: typed(a.endH) };
}

/** "11 o'clock → 2 o'clock clockwise (anterior to left anterior)", in the viewer's convention. */
export function describeArc(a: { startH: number; endH: number }, conv: DisplayConvention) {
  if (isFullCircle(a)) return "The whole circumference (12 of 12 clock hours)";
  return `${formatClock(toDisplayHours(a.startH, conv))} → ${formatClock(toDisplayHours(a.endH, conv))} clockwise (${sectorName(a.startH)} to ${sectorName(a.endH)})`;
}

export function ArcInputs({ drafts, onChange, conv, error }: { drafts: ArcDraft[]; onChange: (d: ArcDraft[]) => void; conv: DisplayConvention; error?: string }) {
  const set = (i: number, patch: Partial<ArcDraft>) => onChange(drafts.map((d, j) => (j === i ? { ...d, ...patch } : d)));
  const whole = drafts.some((d) => d.whole);
  return (
    <fieldset className="flex flex-col gap-2">
      <legend className="text-sm font-semibold">Treated arcs, clockwise, in clock hours ({numberingSuffix(conv)})</legend>
      <label className="inline-flex min-h-11 items-center gap-2 text-sm">
        <input type="checkbox" className="size-5" checked={whole} onChange={(e) => onChange([e.target.checked ? { start: "", end: "", whole: true } : { start: "", end: "" }])} />
        Whole circumference treated
      </label>
      {whole ? <p className="text-sm text-ink-soft">{describeArc(fullCircle(), conv)}</p> : null}
      {whole ? null : drafts.map((d, i) => {
        const stored = toStoredArcs([d], conv)?.[0];
        return (
          <div key={i} className="flex flex-wrap items-end gap-2">
            <label className="flex flex-col text-sm">From
              <input type="number" min={0.5} max={12} step={0.5} inputMode="decimal" className={`${inputClass} w-24`} value={d.start} onChange={(e) => set(i, { start: e.target.value })} aria-label={`Arc ${i + 1} from (clock hour)`} />
            </label>
            <label className="flex flex-col text-sm">To
              <input type="number" min={0.5} max={12} step={0.5} inputMode="decimal" className={`${inputClass} w-24`} value={d.end} onChange={(e) => set(i, { end: e.target.value })} aria-label={`Arc ${i + 1} to (clock hour)`} />
            </label>
            <Button type="button" variant="ghost" onClick={() => onChange(drafts.filter((_, j) => j !== i))} aria-label={`Remove arc ${i + 1}`}>Remove arc</Button>
            {stored ? <p className="basis-full text-sm text-ink-soft">{describeArc(stored, conv)}</p> : null}
          </div>
        );
      })}
      {whole ? null : <div><Button type="button" variant="secondary" onClick={() => onChange([...drafts, { start: "", end: "" }])}>Add an arc</Button></div>}
      {error ? <p className="text-sm font-semibold text-danger-ink">✕ {error}</p> : null}
    </fieldset>
  );
}
