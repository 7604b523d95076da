import type { AgentDoseAssessment } from "@/lib/dosing";
import { AGENT_WORDS } from "@/lib/domain/labels";
import { round1 } from "./labels";

const LEVEL_WORD = { ok: "Within the maximum", near: "Close to the maximum", over: "Over the maximum" } as const;
const LEVEL_MARK = { ok: "✓", near: "△", over: "⚠" } as const;
const FILL = { ok: "bg-lagoon-600", near: "bg-caution-rule", over: "bg-danger-ink" } as const;

/** Running total against the maximum: numbers and a word carry the meaning; the bar and hue only repeat it. */
export function DoseBar({ a }: { a: AgentDoseAssessment }) {
  const pct = Math.round(a.fraction * 100);
  return (
    <div className="flex flex-col gap-1">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <p className="font-semibold">{AGENT_WORDS[a.agent]} {a.withEpinephrineLimit ? "with epinephrine" : "without epinephrine"}</p>
        <p className="tabular-nums"><span className="font-bold">{round1(a.totalMg)} mg</span> of {round1(a.maxMg)} mg ({pct}%)</p>
      </div>
      <div role="meter" aria-valuemin={0} aria-valuemax={round1(a.maxMg)} aria-valuenow={round1(a.totalMg)} aria-label={`${AGENT_WORDS[a.agent]} total`}
        className="relative h-4 overflow-hidden rounded border border-ink-soft bg-paper">
        <div className={`h-full ${FILL[a.level]}`} style={{ width: `${Math.min(100, pct)}%` }} />
        {/* The 80 % warning mark, drawn as a line so it reads in greyscale. */}
        <div aria-hidden className="absolute top-0 h-full border-l-2 border-dashed border-ink" style={{ left: "80%" }} />
      </div>
      <p className="text-sm"><span aria-hidden>{LEVEL_MARK[a.level]} </span><span className="font-semibold">{LEVEL_WORD[a.level]}.</span>{" "}
        <span className="text-ink-soft">Basis: {a.basis === "weight" ? "patient's weight" : "label ceiling"}. {a.explanation}</span></p>
    </div>
  );
}
