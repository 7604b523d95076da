"use client";
// Settling a reviewer's disagreement: the clinician says which status stands (the reviewer's,
// the record having been changed to match, or the recorded one) and may say why.
import { useId, useState } from "react";
import { Button } from "@/components/ui/button";
import { ApiError, sendJson } from "@/components/data/fetcher";
import { api } from "@/components/data/keys";
import { DISAGREEMENT_OUTCOMES, DISAGREEMENT_OUTCOME_LABEL, type DisagreementOutcome } from "@/lib/domain/vocab";

export function ResolveDisagreement({ adjudicationId, trackLabel, onDone, onCancel }: { adjudicationId: string; trackLabel: string; onDone: () => void; onCancel: () => void }) {
  const id = useId();
  const [outcome, setOutcome] = useState<DisagreementOutcome | null>(null);
  const [note, setNote] = useState("");
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);

  const submit = async () => {
    setBusy(true);
    setError(null);
    try {
      await sendJson("POST", api.resolveAdjudication(adjudicationId), { outcome, note: note.trim() || null });
      onDone();
    } catch (e) {
      const fields = e instanceof ApiError ? e.fields : undefined;
      setError(fields ? Object.values(fields).flat().join(" ") : e instanceof Error ? e.message : "Not resolved.");
    } finally {
      setBusy(false);
    }
  };

  return (
    <form className="mt-2 flex flex-col gap-2 rounded-md border border-rule bg-panel p-2 text-ink" onSubmit={(e) => { e.preventDefault(); void submit(); }}>
      <fieldset>
        <legend className="font-semibold">Which status stands for {trackLabel}?</legend>
        {DISAGREEMENT_OUTCOMES.map((o) => (
          <label key={o} className="flex min-h-11 items-center gap-2">
            <input type="radio" name={`${id}-outcome`} value={o} checked={outcome === o} onChange={() => setOutcome(o)} />
            {DISAGREEMENT_OUTCOME_LABEL[o]}
          </label>
        ))}
      </fieldset>
      <label htmlFor={`${id}-note`} className="font-semibold">Note (optional)</label>
      <textarea id={`${id}-note`} value={note} onChange={(e) => setNote(e.target.value)} maxLength={2000} rows={2} className="rounded-md border border-rule-strong bg-panel px-2 py-1" />
      {error ? <p role="alert" className="text-danger-ink">{error}</p> : null}
      <div className="flex flex-wrap gap-2">
        <Button type="submit" disabled={busy || !outcome}>Record resolution</Button>
        <Button type="button" variant="secondary" onClick={onCancel}>Cancel</Button>
      </div>
    </form>
  );
}
