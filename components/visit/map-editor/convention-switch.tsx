"use client";
import { POSITIONS } from "@/lib/domain/vocab";
import { CONVENTION_LABEL } from "@/components/canal-map";
import type { DisplayConvention } from "@/lib/geometry";

/** How the clock is numbered on screen, per user. Changes the view, never the data. */
export function ConventionSwitch({ value, onChange }: { value: DisplayConvention; onChange: (v: DisplayConvention) => void }) {
  return (
    <div role="radiogroup" aria-label="Clock numbering" className="inline-flex overflow-hidden rounded-md border border-rule-strong bg-panel">
      {POSITIONS.map((p) => (
        <button
          key={p}
          type="button"
          role="radio"
          aria-checked={value === p}
          onClick={() => onChange(p)}
          className={`min-h-11 px-3 text-sm font-semibold ${value === p ? "bg-lagoon-600 text-white" : "text-ink hover:bg-lagoon-50"}`}
        >
          {CONVENTION_LABEL[p]}
        </button>
      ))}
    </div>
  );
}
