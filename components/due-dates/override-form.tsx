"use client";

import { useActionState } from "react";
import { Button } from "@/components/ui/button";
import type { OverrideState } from "@/lib/validation/due-dates";
import { ISO_DATE_INPUT } from "@/components/ui/date-input";

export type OverrideAction = (prev: OverrideState, form: FormData) => Promise<OverrideState>;

export function OverrideForm({ patientId, hasOverride, overrideAction }: { patientId: string; hasOverride: boolean; overrideAction: OverrideAction }) {
  const [state, action, pending] = useActionState<OverrideState, FormData>(overrideAction, {});
  const f = state.fields ?? {};
  return (
    <details className="mt-2 text-ink">
      <summary className="inline-flex min-h-11 cursor-pointer items-center font-semibold text-lagoon-700">Set the date yourself</summary>
      <form action={action} className="mt-2 flex flex-wrap items-end gap-3" noValidate>
        <input type="hidden" name="patientId" value={patientId} />
        <div>
          <label htmlFor="due-date" className="block text-sm font-semibold">Next visit by</label>
          <input id="due-date" name="date" {...ISO_DATE_INPUT} required className="mt-1 min-h-11 rounded-md border border-rule-strong bg-panel px-2" />
          {f.date ? <p className="mt-1 text-sm text-danger-ink">{f.date[0]}</p> : null}
        </div>
        <div className="min-w-64 flex-1">
          <label htmlFor="due-reason" className="block text-sm font-semibold">Reason</label>
          <input id="due-reason" name="reason" required maxLength={500} className="mt-1 min-h-11 w-full rounded-md border border-rule-strong bg-panel px-3" />
          {f.reason ? <p className="mt-1 text-sm text-danger-ink">{f.reason[0]}</p> : null}
        </div>
        <Button type="submit" name="mode" value="set" disabled={pending}>Save date</Button>
        {hasOverride ? <Button type="submit" name="mode" value="clear" variant="secondary" disabled={pending} formNoValidate>Use the rules again</Button> : null}
      </form>
      {state.message ? <p role="alert" className="mt-1 text-sm text-danger-ink">{state.message}</p> : null}
      {state.ok ? <p role="status" className="mt-1 text-sm text-ok-ink">Saved.</p> : null}
    </details>
  );
}
