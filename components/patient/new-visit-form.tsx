"use client";

import { useState } from "react";
import { useRouter } from "next/navigation";
import { ApiError, sendJson } from "@/components/data/fetcher";
import { api } from "@/components/data/keys";
import { ISO_DATE_INPUT } from "@/components/ui/date-input";

const POSITIONS = [
  ["lithotomy", "Lithotomy"],
  ["prone_jackknife", "Prone jack-knife"],
  ["left_lateral", "Left lateral (Sims)"],
] as const;

/** Opens a new draft visit for today (or a chosen date) and goes straight to its map. */
export function NewVisitForm({ patientId, today }: { patientId: string; today: string }) {
  const router = useRouter();
  const [date, setDate] = useState(today);
  const [position, setPosition] = useState<string>("lithotomy");
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    setBusy(true);
    setError(null);
    try {
      const { visit } = await sendJson<{ visit: { id: string } }>("POST", api.patientVisits(patientId), { visitDate: date, patientPosition: position });
      router.push(`/patients/${patientId}/visits/${visit.id}`);
    } catch (err) {
      setError(err instanceof ApiError ? Object.values(err.fields ?? {})[0]?.[0] ?? err.message : "The visit could not be created.");
      setBusy(false);
    }
  }

  return (
    <form onSubmit={submit} className="flex flex-wrap items-end gap-3 rounded-lg border border-rule bg-panel p-3" aria-label="Start a new visit">
      <label className="text-sm font-semibold">Visit date<br />
        <input {...ISO_DATE_INPUT} value={date} onChange={(e) => setDate(e.target.value)} required className="min-h-11 rounded-md border border-rule-strong px-2 font-normal" />
      </label>
      <label className="text-sm font-semibold">Patient position<br />
        <select value={position} onChange={(e) => setPosition(e.target.value)} className="min-h-11 rounded-md border border-rule-strong bg-panel px-2 font-normal">
          {POSITIONS.map(([v, l]) => <option key={v} value={v}>{l}</option>)}
        </select>
      </label>
      <button disabled={busy} className="min-h-11 rounded-md bg-lagoon-600 px-4 font-semibold text-white hover:bg-lagoon-700 disabled:bg-rule-strong">{busy ? "Opening…" : "Start visit"}</button>
      {error ? <p role="alert" className="w-full text-sm text-danger-ink">{error}</p> : null}
    </form>
  );
}
