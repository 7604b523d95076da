"use client";

import { useState } from "react";
import { useRouter } from "next/navigation";
import { ApiError, sendJson } from "@/components/data/fetcher";
import { AIN_GRADES, HISTOLOGY, HISTOLOGY_LABEL, P16 } from "@/lib/domain/vocab";
import { api } from "@/components/data/keys";

const P16_LABEL: Record<(typeof P16)[number], string> = { block_positive: "Block positive", not_block: "Positive, not block-type", negative: "Negative", not_done: "Not done" };

/** Enter the laboratory result for one specimen. */
export function ResultForm({ biopsyId, specimen, onSaved }: { biopsyId: string; specimen: string; onSaved?: () => unknown }) {
  const router = useRouter();
  const [histology, setHistology] = useState<string>("");
  const [ain, setAin] = useState<string>("");
  const [p16, setP16] = useState<string>("not_done");
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function save(e: React.FormEvent) {
    e.preventDefault();
    setBusy(true);
    setError(null);
    try {
      await sendJson("PATCH", api.biopsy(biopsyId), { histology, ainGrade: ain || null, p16 });
      if (onSaved) await onSaved();
      else router.refresh();
    } catch (err) {
      setError(err instanceof ApiError ? Object.values(err.fields ?? {})[0]?.[0] ?? err.message : "Not saved.");
    } finally {
      setBusy(false);
    }
  }

  const sel = "min-h-11 rounded-md border border-rule-strong bg-panel px-2";
  return (
    <form onSubmit={save} className="flex flex-wrap items-end gap-2" aria-label={`Result for specimen ${specimen}`}>
      <label className="text-sm">Histology<br />
        <select required value={histology} onChange={(e) => setHistology(e.target.value)} className={sel}>
          <option value="">Choose…</option>
          {HISTOLOGY.map((h) => <option key={h} value={h}>{HISTOLOGY_LABEL[h]}</option>)}
        </select>
      </label>
      <label className="text-sm">AIN grade<br />
        <select value={ain} onChange={(e) => setAin(e.target.value)} className={sel}>
          <option value="">Not reported</option>
          {AIN_GRADES.map((a) => <option key={a} value={a}>{a.toUpperCase()}</option>)}
        </select>
      </label>
      <label className="text-sm">p16<br />
        <select value={p16} onChange={(e) => setP16(e.target.value)} className={sel}>
          {P16.map((p) => <option key={p} value={p}>{P16_LABEL[p]}</option>)}
        </select>
      </label>
      <button disabled={busy || !histology} className="min-h-11 rounded-md bg-lagoon-600 px-4 font-semibold text-white disabled:bg-rule-strong">{busy ? "Saving…" : "Save result"}</button>
      {error ? <p role="alert" className="w-full text-sm text-danger-ink">{error}</p> : null}
    </form>
  );
}
