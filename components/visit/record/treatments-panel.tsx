"use client";
import { useState } from "react";
import useSWR, { mutate } from "swr";
import { ApiError, fetcher, sendJson } from "@/components/data/fetcher";
import { Button } from "@/components/ui/button";
import { Caution } from "@/components/ui/caution";
import { MODALITIES, type Grade, type Histology, type Modality } from "@/lib/domain/vocab";
import type { ExtentAssessment } from "@/lib/dosing";
import type { DisplayConvention } from "@/lib/geometry";
import { cancerCautionMessage, cancerLesionsReached, gateExtent, isTopical } from "@/lib/validation/treatments";
import { ArcInputs, describeArc, toArcDraft, toStoredArcs, type ArcDraft } from "./arc-inputs";
import { LesionCoverage, partialCoverAnswers } from "./lesion-coverage";
import { ExtentWhy } from "./extent-why";
import { Field, FormError, inputClass, Section } from "./field";
import { MODALITY_WORDS } from "@/lib/domain/labels";
import { api } from "@/components/data/keys";

interface TreatmentRow { id: string; lesionId: string | null; lesionLabel: string | null; treatedLesionIds: string[]; modality: Modality; regimen: string | null; arcs: { startH: number; endH: number }[]; extentOverrideReason: string | null; cancerOverrideReason: string | null; note: string | null }
interface TreatmentsDto { treatments: TreatmentRow[]; extent: ExtentAssessment; cautionFraction: number }
interface LesionsDto { lesions: { id: string; label: string; grade: Grade; clockStartH: number; clockEndH: number; histology: Histology | null }[] }

export function TreatmentsPanel({ visitId, canEdit, conv }: { visitId: string; canEdit: boolean; conv: DisplayConvention }) {
  const key = api.visitPart(visitId, "treatments");
  const { data, error } = useSWR<TreatmentsDto>(key, fetcher);
  const { data: map } = useSWR<LesionsDto>(api.visitPart(visitId, "lesions"), fetcher);
  const [modality, setModality] = useState<Modality>("electrocautery");
  const [lesionId, setLesionId] = useState("");
  const [regimen, setRegimen] = useState("");
  const [drafts, setDrafts] = useState<ArcDraft[]>([{ start: "", end: "" }]);
  const [reason, setReason] = useState("");
  const [cancerReason, setCancerReason] = useState("");
  const [note, setNote] = useState("");
  const [answers, setAnswers] = useState<Record<string, boolean>>({});
  const [fields, setFields] = useState<Record<string, string[]>>({});
  const [serverError, setServerError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  const arcs = toStoredArcs(drafts, conv);
  // Preview only; the server recomputes the union of every treated arc of the visit.
  const preview = data && arcs?.length ? gateExtent(data.treatments.flatMap((t) => t.arcs), arcs, data.cautionFraction) : null;

  // Choosing a lesion fills in its mapped extent; the clinician narrows it to what was actually
  // treated (the treated area may be smaller than the lesion: common practice, no source).
  function pickLesion(id: string) {
    setLesionId(id);
    const l = map?.lesions.find((x) => x.id === id);
    if (l && drafts.every((d) => d.start === "" && d.end === "")) setDrafts([toArcDraft({ startH: l.clockStartH, endH: l.clockEndH }, conv)]);
  }

  // Shown before saving; the server applies the same rule to what it holds.
  const risks = (map?.lesions ?? []).map((l) => ({ id: l.id, label: l.label, startH: l.clockStartH, endH: l.clockEndH, grade: l.grade, carcinomaOnHistology: l.histology === "scc" }));
  const cancerReached = cancerLesionsReached(risks, lesionId || null, arcs ?? [], modality);

  async function add(e: React.FormEvent) {
    e.preventDefault();
    setBusy(true); setFields({}); setServerError(null);
    try {
      const partialCover = partialCoverAnswers(risks, lesionId || null, arcs ?? [], answers);
      await sendJson("POST", key, { modality, lesionId: lesionId || null, regimen: regimen || null, arcs: arcs ?? [], extentOverrideReason: reason.trim() || null, cancerOverrideReason: cancerReason.trim() || null, note: note || null, partialCover });
      setDrafts([{ start: "", end: "" }]); setReason(""); setCancerReason(""); setNote(""); setRegimen(""); setLesionId(""); setAnswers({});
      await Promise.all([mutate(key), mutate(api.visitPart(visitId, "lesions"))]);
    } catch (err) {
      if (err instanceof ApiError) { setFields(err.fields ?? {}); setServerError(err.fields ? null : err.message); }
      else setServerError("The treatment could not be saved.");
    } finally { setBusy(false); }
  }

  async function remove(id: string) {
    try { await sendJson("DELETE", `${key}/${id}`); await mutate(key); }
    catch (err) { setServerError(err instanceof ApiError ? err.message : "The treatment could not be removed."); }
  }

  const treatedLabels = (t: TreatmentRow) => (map?.lesions ?? []).filter((l) => (t.treatedLesionIds ?? []).includes(l.id) || l.id === t.lesionId).map((l) => l.label);
  const arcError = fields.arcs?.[0] ?? Object.entries(fields).find(([k]) => k.startsWith("arcs."))?.[1][0];
  return (
    <Section id="treatments" title="Treatments">
      {error ? <FormError message={error.message} /> : null}
      {data ? (
        data.extent.level === "caution"
          ? <Caution title="Large part of the circumference treated at this visit">{data.extent.message} <ExtentWhy cautionFraction={data.cautionFraction} /></Caution>
          : <p className="text-sm">{data.extent.message}</p>
      ) : null}
      {data?.treatments.length ? (
        <ul className="divide-y divide-rule rounded-md border border-rule">
          {data.treatments.map((t) => (
            <li key={t.id} className="flex flex-wrap items-start justify-between gap-2 px-3 py-2">
              <div>
                <p className="font-semibold">{MODALITY_WORDS[t.modality]}{t.lesionLabel ? ` · lesion ${t.lesionLabel}` : ""}</p>
                {t.regimen ? <p className="text-sm">Regimen: {t.regimen}</p> : null}
                {t.arcs.map((a, i) => <p key={i} className="text-sm">{describeArc(a, conv)}</p>)}
                {treatedLabels(t).length ? <p className="text-sm">Treated for follow-up: lesion {treatedLabels(t).join(", ")}</p> : null}
                {t.extentOverrideReason ? <p className="text-sm">△ Saved past the caution level, recorded reason: {t.extentOverrideReason}</p> : null}
                {t.cancerOverrideReason ? <p className="text-sm">⚠ Treated although it may be cancer, recorded reason: {t.cancerOverrideReason}</p> : null}
                {t.note ? <p className="text-sm text-ink-soft">{t.note}</p> : null}
              </div>
              {canEdit ? <Button variant="ghost" onClick={() => remove(t.id)} aria-label={`Remove ${MODALITY_WORDS[t.modality]} treatment`}>Remove</Button> : null}
            </li>
          ))}
        </ul>
      ) : data ? <p className="text-sm text-ink-soft">No treatments recorded.</p> : null}
      {canEdit ? (
        <form onSubmit={add} noValidate className="grid gap-3 sm:grid-cols-2">
          <Field id="t-modality" label="How it was treated" error={fields.modality?.[0]}>
            <select id="t-modality" className={inputClass} value={modality} onChange={(e) => setModality(e.target.value as Modality)}>
              {MODALITIES.map((m) => <option key={m} value={m}>{MODALITY_WORDS[m]}</option>)}
            </select>
          </Field>
          <Field id="t-lesion" label="Lesion (optional)" error={fields.lesionId?.[0]}>
            <select id="t-lesion" className={inputClass} value={lesionId} onChange={(e) => pickLesion(e.target.value)}>
              <option value="">No single lesion: the arcs below</option>
              {map?.lesions.map((l) => <option key={l.id} value={l.id}>{l.label}</option>)}
            </select>
          </Field>
          {isTopical(modality) ? (
            <div className="sm:col-span-2"><Field id="t-regimen" label="Regimen" error={fields.regimen?.[0]} hint="What, how often, for how long.">
              <input id="t-regimen" className={inputClass} value={regimen} onChange={(e) => setRegimen(e.target.value)} />
            </Field></div>
          ) : null}
          <div className="sm:col-span-2"><ArcInputs drafts={drafts} onChange={setDrafts} conv={conv} error={arcError} /></div>
          <div className="sm:col-span-2"><LesionCoverage lesions={risks} lesionId={lesionId || null} arcs={arcs ?? []} answers={answers} onAnswer={(id, v) => setAnswers((a) => ({ ...a, [id]: v }))} error={fields.partialCover?.[0]} /></div>
          {preview ? <p className="text-sm sm:col-span-2">With this treatment: {preview.assessment.message}</p> : null}
          {preview?.needsReason || fields.extentOverrideReason ? (
            <div className="flex flex-col gap-2 sm:col-span-2">
              <Caution title="This reaches the caution level for one session">{preview?.assessment.message} <ExtentWhy cautionFraction={data!.cautionFraction} /> To save it, give the reason; it is kept with the record.</Caution>
              <Field id="t-reason" label="Reason for treating this much in one session" error={fields.extentOverrideReason?.[0]}>
                <input id="t-reason" className={inputClass} value={reason} onChange={(e) => setReason(e.target.value)} />
              </Field>
            </div>
          ) : null}
          {cancerReached.length || fields.cancerOverrideReason ? (
            <div className="flex flex-col gap-2 sm:col-span-2">
              <Caution tone="danger" title="This lesion may be cancer">{cancerReached.length ? cancerCautionMessage(cancerReached) : fields.cancerOverrideReason?.[0]} To save the treatment, give the reason; it is kept with the record.</Caution>
              <Field id="t-cancer-reason" label="Reason for treating a lesion that may be cancer" error={fields.cancerOverrideReason?.[0]}>
                <input id="t-cancer-reason" className={inputClass} value={cancerReason} onChange={(e) => setCancerReason(e.target.value)} />
              </Field>
            </div>
          ) : null}
          <div className="sm:col-span-2"><Field id="t-note" label="Note (optional)" error={fields.note?.[0]}>
            <input id="t-note" className={inputClass} value={note} onChange={(e) => setNote(e.target.value)} />
          </Field></div>
          <div className="sm:col-span-2"><Button type="submit" disabled={busy || !arcs}>{busy ? "Saving…" : "Add treatment"}</Button></div>
          <div className="sm:col-span-2"><FormError message={serverError} /></div>
        </form>
      ) : null}
    </Section>
  );
}
