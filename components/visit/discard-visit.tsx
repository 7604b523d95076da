"use client";

import { useState } from "react";
import { useRouter } from "next/navigation";
import { ApiError, sendJson } from "@/components/data/fetcher";
import { api } from "@/components/data/keys";
import { reasonProblem } from "@/lib/validation/text";

/**
 * Discards a draft visit started by mistake, after a confirm step with a typed reason (kept in
 * the audit log). Only the visit's examiner or an administrator may; the server decides.
 */
export function DiscardVisit({ visitId, patientId }: { visitId: string; patientId: string }) {
  const router = useRouter();
  const [open, setOpen] = useState(false);
  const [reason, setReason] = useState("");
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const problem = reasonProblem(reason);

  async function confirm() {
    setBusy(true);
    setError(null);
    try {
      await sendJson("POST", `${api.visit(visitId)}/discard`, { reason });
      router.push(`/patients/${patientId}`);
      router.refresh();
    } catch (e) {
      setError(e instanceof ApiError ? (e.fields?.reason?.[0] ?? e.message) : "The draft could not be discarded.");
      setBusy(false);
    }
  }

  if (!open) {
    return (
      <button type="button" onClick={() => setOpen(true)} className="min-h-11 rounded-md border border-danger-rule px-3 font-semibold text-danger-ink hover:bg-danger-bg">
        Discard this draft…
      </button>
    );
  }
  return (
    <section aria-labelledby="discard-heading" className="rounded-md border-2 border-danger-rule bg-danger-bg p-3 text-danger-ink">
      <h2 id="discard-heading" className="font-bold">Discard this draft visit?</h2>
      <p className="mt-1 text-sm">It leaves the patient&apos;s visits and timeline with everything recorded in it. The audit trail keeps who discarded it, when and why. A signed visit can never be discarded.</p>
      <label className="mt-2 block text-sm font-semibold">Reason (kept in the audit trail)
        <input value={reason} onChange={(e) => setReason(e.target.value)} maxLength={500} aria-invalid={error ? true : undefined} className="mt-1 block min-h-11 w-full rounded-md border border-rule-strong bg-panel px-2 font-normal text-ink" />
      </label>
      {error ? <p role="alert" className="mt-1 text-sm font-semibold">{error}</p> : null}
      <div className="mt-2 flex gap-2">
        <button type="button" onClick={confirm} disabled={busy || problem !== null} className="min-h-11 rounded-md bg-danger-ink px-3 font-semibold text-white disabled:opacity-50">
          Discard draft
        </button>
        <button type="button" onClick={() => { setOpen(false); setReason(""); setError(null); }} className="min-h-11 rounded-md border border-rule-strong bg-panel px-3 font-semibold text-ink">
          Keep it
        </button>
      </div>
    </section>
  );
}
