"use client";
// Labelled inputs for the patient form: 44 px tall, the message under the field, tied by aria.
import { forwardRef, useId, type InputHTMLAttributes, type SelectHTMLAttributes } from "react";

interface Common {
  label: string;
  hint?: string;
  error?: string;
}

function Label({ id, label, hint }: { id: string; label: string; hint?: string }) {
  return (
    <label htmlFor={id} className="block text-sm font-semibold">
      {label}
      {hint ? <span className="font-normal text-ink-soft"> ({hint})</span> : null}
    </label>
  );
}

const control = "mt-1 min-h-11 w-full rounded-md border border-rule-strong bg-panel px-3";

export const Field = forwardRef<HTMLInputElement, Common & InputHTMLAttributes<HTMLInputElement>>(function Field({ label, hint, error, ...rest }, ref) {
  const id = useId();
  return (
    <div>
      <Label id={id} label={label} hint={hint} />
      <input id={id} ref={ref} {...rest} aria-invalid={error ? true : undefined} aria-describedby={error ? `${id}-error` : undefined} className={control} />
      {error ? <p id={`${id}-error`} className="mt-1 text-sm text-danger-ink">{error}</p> : null}
    </div>
  );
});

export const SelectField = forwardRef<HTMLSelectElement, Common & SelectHTMLAttributes<HTMLSelectElement> & { options: [string, string][]; placeholder?: string }>(
  function SelectField({ label, hint, error, options, placeholder, ...rest }, ref) {
    const id = useId();
    return (
      <div>
        <Label id={id} label={label} hint={hint} />
        <select id={id} ref={ref} {...rest} aria-invalid={error ? true : undefined} aria-describedby={error ? `${id}-error` : undefined} className={control}>
          {placeholder !== undefined ? <option value="">{placeholder}</option> : null}
          {options.map(([value, words]) => <option key={value} value={value}>{words}</option>)}
        </select>
        {error ? <p id={`${id}-error`} className="mt-1 text-sm text-danger-ink">{error}</p> : null}
      </div>
    );
  },
);
