"use client";
import { useState, type ReactNode } from "react";
import { Controller, type Control, type FieldValues, type Path } from "react-hook-form";
import { clockText, fromDisplayHours, parseClockText, toDisplayHours, type DisplayConvention } from "@/lib/geometry";
import { numberingSuffix } from "@/components/visit/numbering";

/**
 * A clock field in hours and minutes ("2:30"), as the table and the map write them, in the page's
 * numbering; stored in the lithotomy frame. "2.30" is read as 2:30 for keypads without a colon.
 */
export function ClockField<T extends FieldValues>({ control, name, label, conv, onDone, error }: { control: Control<T>; name: Path<T>; label: string; conv: DisplayConvention; onDone: () => void; error?: string }): ReactNode {
  return (
    <Controller control={control} name={name} render={({ field }) => (
      <ClockInput label={`${label} (h:mm, ${numberingSuffix(conv)})`} error={error} storedH={field.value as number} conv={conv}
        onValue={(h) => field.onChange(h)} onBlur={() => { field.onBlur(); onDone(); }} />
    )} />
  );
}

function ClockInput({ label, error, storedH, conv, onValue, onBlur }: { label: string; error?: string; storedH: number; conv: DisplayConvention; onValue: (storedH: number) => void; onBlur: () => void }) {
  const shown = Number.isFinite(storedH) ? clockText(toDisplayHours(storedH, conv)) : "";
  // What the user is typing, until the field is left: "2:" is on its way to "2:30".
  const [draft, setDraft] = useState<string | null>(null);
  return (
    <label className="block text-sm font-semibold">
      {label}
      <input
        type="text"
        inputMode="decimal"
        autoComplete="off"
        className="mt-1 block min-h-11 w-full rounded-md border border-rule-strong bg-panel px-2 text-base font-normal tabular-nums"
        value={draft ?? shown}
        onChange={(e) => {
          setDraft(e.target.value);
          const h = parseClockText(e.target.value);
          onValue(h === null ? NaN : fromDisplayHours(h, conv));
        }}
        onBlur={() => { setDraft(null); onBlur(); }}
      />
      {error ? <span role="alert" className="text-danger-ink">{error}</span> : null}
    </label>
  );
}
