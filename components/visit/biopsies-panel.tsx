"use client";
// Specimens of one visit: take a biopsy from a mapped lesion or from a clock position and
// distance; labels A, B, C… come from the server; the result is entered here or later from the
// worklist of biopsies awaiting results.
import { useState } from "react";
import useSWR, { useSWRConfig } from "swr";
import { ApiError, fetcher, sendJson } from "@/components/data/fetcher";
import { ResultForm } from "@/components/biopsies/result-form";
import { GRADE_LABEL, HISTOLOGY_LABEL, type Histology } from "@/lib/domain/vocab";
import { describeSite, fromDisplayHours } from "@/lib/geometry/conventions";
import { numberingSuffix, useNumbering } from "@/components/visit/numbering";
import type { VisitMapDto } from "@/lib/validation/lesions";
import { api } from "@/components/data/keys";

interface BiopsyRow {
  id: string;
  specimenLabel: string;
  lesionId: string | null;
  lesionLabel: string | null;
  clockH: number;
  distanceCm: number;
  histology: Histology | null;
  ainGrade: string | null;
  p16: string | null;
}

export function BiopsiesPanel({ visitId, canEdit, canEnterResults }: { visitId: string; canEdit: boolean; canEnterResults: boolean }) {
  const key = api.visitPart(visitId, "biopsies");
  const lesionsKey = api.visitPart(visitId, "lesions");
  const { mutate } = useSWRConfig();
  const { data } = useSWR<{ biopsies: BiopsyRow[] }>(key, fetcher);
  const { data: map } = useSWR<VisitMapDto>(lesionsKey, fetcher);
  const [lesionId, setLesionId] = useState("");
  const [clock, setClock] = useState("");
  // Clock numbers typed and shown in the page's numbering; stored in the lithotomy frame.
  const { conv } = useNumbering("lithotomy");
  const [dist, setDist] = useState("");
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function take(body: object) {
    setBusy(true);
    setError(null);
    try {
      await sendJson("POST", key, body);
      // Cleared as soon as the specimen is stored, before the lists reload: a lesion picked for
      // the next specimen while they reload must not be wiped when they are done.
      setLesionId("");
      setClock("");
      setDist("");
      await Promise.all([mutate(key), mutate(lesionsKey)]);
    } catch (err) {
      setError(err instanceof ApiError ? Object.values(err.fields ?? {})[0]?.[0] ?? err.message : "Not saved.");
    } finally {
      setBusy(false);
    }
  }

  const rows = data?.biopsies ?? [];
  const lesions = map?.lesions ?? [];
  const input = "min-h-11 rounded-md border border-rule-strong bg-panel px-2";
  return (
    <section aria-labelledby="biopsies-heading" className="rounded-xl border border-rule bg-panel p-4">
      <h2 id="biopsies-heading" className="text-lg font-bold">Biopsies</h2>
      <p className="text-sm text-ink-soft">Specimen letters follow the order taken and are printed on the requisition. When histology differs from the impression, histology decides the grade for tracking.</p>
      <ul className="mt-3 divide-y divide-rule">
        {rows.map((b) => (
          <li key={b.id} className="py-2">
            <p>
              <span className="mr-2 inline-flex h-7 w-7 items-center justify-center border-2 border-ink font-bold" aria-hidden>{b.specimenLabel}</span>
              <span className="font-semibold">Specimen {b.specimenLabel}</span>
              {b.lesionLabel ? ` · from ${b.lesionLabel}` : ""} · {describeSite(b.clockH, b.clockH, b.distanceCm, b.distanceCm, conv)} ({numberingSuffix(conv)})
              {" · "}
              {b.histology ? <strong>Histology {HISTOLOGY_LABEL[b.histology]}{b.ainGrade ? ` (${b.ainGrade.toUpperCase()}${b.p16 && b.p16 !== "not_done" ? `, p16 ${b.p16.replace("_", " ")}` : ""})` : ""}</strong> : <em>Awaiting result</em>}
            </p>
            {canEnterResults && !b.histology ? <div className="mt-2"><ResultForm biopsyId={b.id} specimen={b.specimenLabel} onSaved={() => Promise.all([mutate(key), mutate(lesionsKey)])} /></div> : null}
          </li>
        ))}
        {rows.length === 0 ? <li className="py-2 text-ink-soft">No specimens taken at this visit.</li> : null}
      </ul>
      {canEdit ? (
        <div className="mt-3 flex flex-wrap items-end gap-3 border-t border-rule pt-3">
          <label className="text-sm font-semibold">From lesion<br />
            <select value={lesionId} onChange={(e) => setLesionId(e.target.value)} className={input}>
              <option value="">Choose a lesion…</option>
              {lesions.map((l) => <option key={l.id} value={l.id}>{l.label} · {GRADE_LABEL[l.grade]}</option>)}
            </select>
          </label>
          <button type="button" disabled={busy || !lesionId} onClick={() => take({ lesionId })} className="min-h-11 rounded-md bg-lagoon-600 px-4 font-semibold text-white disabled:bg-rule-strong">Take biopsy</button>
          <span className="self-center text-sm text-ink-soft">or at</span>
          <label className="text-sm font-semibold">Clock (o&apos;clock, {numberingSuffix(conv)})<br /><input inputMode="decimal" value={clock} onChange={(e) => setClock(e.target.value)} className={`${input} w-24`} /></label>
          <label className="text-sm font-semibold">cm from verge<br /><input inputMode="decimal" value={dist} onChange={(e) => setDist(e.target.value)} className={`${input} w-24`} /></label>
          <button type="button" disabled={busy || clock === "" || dist === ""} onClick={() => take({ clockH: fromDisplayHours(Number(clock) % 12, conv), distanceCm: Number(dist) })} className="min-h-11 rounded-md border border-rule-strong px-4 font-semibold disabled:text-ink-soft">Take biopsy here</button>
          {error ? <p role="alert" className="w-full text-sm text-danger-ink">{error}</p> : null}
        </div>
      ) : null}
    </section>
  );
}
