import type { ReactNode } from "react";

/** A labelled control with its error message below; the message is tied to the control for screen readers. */
export function Field({ id, label, error, hint, children }: { id: string; label: string; error?: string; hint?: string; children: ReactNode }) {
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-sm font-semibold">{label}</label>
      {children}
      {hint ? <p className="text-xs text-ink-soft">{hint}</p> : null}
      {error ? <p id={`${id}-error`} className="text-sm font-semibold text-danger-ink">✕ {error}</p> : null}
    </div>
  );
}

export const inputClass = "min-h-11 w-full rounded-md border border-rule-strong bg-panel px-3 text-base disabled:bg-paper disabled:text-ink-soft";

export function Section({ title, id, children, aside }: { title: string; id: string; children: ReactNode; aside?: ReactNode }) {
  return (
    <section aria-labelledby={id} className="rounded-lg border border-rule bg-panel p-4">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 id={id} className="text-lg font-bold">{title}</h2>
        {aside}
      </div>
      <div className="mt-3 flex flex-col gap-3">{children}</div>
    </section>
  );
}

/** An error from the server, shown where the action happened. */
export function FormError({ message }: { message?: string | null }) {
  if (!message) return null;
  return <p role="alert" className="rounded-md border-l-4 border-danger-rule bg-danger-bg px-3 py-2 text-sm font-semibold text-danger-ink">✕ {message}</p>;
}
