"use client";
import { useState } from "react";
import useSWR, { mutate } from "swr";
import { ApiError, fetcher, sendJson } from "@/components/data/fetcher";
import { Button } from "@/components/ui/button";
import { Caution } from "@/components/ui/caution";
import { ANAESTHETIC_AGENTS, type AnaestheticAgent } from "@/lib/domain/vocab";
import { mgFromPercentAndMl, type DoseAssessment } from "@/lib/dosing";
import { anaestheticSchema, gateDose } from "@/lib/validation/treatments";
import { DoseBar } from "./dose-bar";
import { Field, FormError, inputClass, Section } from "./field";
import { AGENT_WORDS } from "@/lib/domain/labels";
import { round1 } from "./labels";
import { api } from "@/components/data/keys";

interface DoseRow { id: string; agent: AnaestheticAgent; concentrationPct: number; volumeMl: number; withEpinephrine: boolean; doseMg: number; overrideReason: string | null }
interface DosesDto { entries: DoseRow[]; weightKg: number | null; assessment: DoseAssessment }

const STATEMENT = "Limits follow the product label and your local protocol; the treating clinician decides.";

export function AnaestheticPanel({ visitId, canEdit }: { visitId: string; canEdit: boolean }) {
  const key = api.visitPart(visitId, "anaesthetic");
  const { data, error } = useSWR<DosesDto>(key, fetcher);
  const [agent, setAgent] = useState<AnaestheticAgent>("lidocaine");
  const [pct, setPct] = useState("1");
  const [ml, setMl] = useState("");
  const [epi, setEpi] = useState(false);
  const [reason, setReason] = useState("");
  const [fields, setFields] = useState<Record<string, string[]>>({});
  const [serverError, setServerError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  const entry = { agent, concentrationPct: Number(pct), volumeMl: Number(ml), withEpinephrine: epi };
  const valid = anaestheticSchema.safeParse(entry).success && ml !== "";
  // A preview only: the server recomputes the same gate and has the last word.
  const preview = data && valid ? gateDose(data.entries, entry, data.weightKg) : null;

  async function add(e: React.FormEvent) {
    e.preventDefault();
    setBusy(true); setFields({}); setServerError(null);
    try {
      await sendJson("POST", key, { ...entry, overrideReason: reason.trim() || null });
      setMl(""); setReason("");
      await mutate(key);
    } catch (err) {
      if (err instanceof ApiError) { setFields(err.fields ?? {}); setServerError(err.fields ? null : err.message); }
      else setServerError("The entry could not be saved.");
    } finally { setBusy(false); }
  }

  async function remove(id: string) {
    try { await sendJson("DELETE", `${key}/${id}`); await mutate(key); }
    catch (err) { setServerError(err instanceof ApiError ? err.message : "The entry could not be removed."); }
  }

  return (
    <Section id="anaesthetic" title="Local anaesthetic">
      <p className="text-sm">{STATEMENT}</p>
      {error ? <FormError message={error.message} /> : null}
      {data && data.weightKg === null ? (
        <Caution title="No weight recorded">The weight-based limit cannot be computed; only the label ceiling applies. Enter the weight in the exam details.</Caution>
      ) : null}
      {data?.assessment.agents.map((a) => <DoseBar key={a.agent} a={a} />)}
      {data && data.assessment.agents.length > 1 ? (
        <p className="text-sm"><span className="font-semibold">Combined: {Math.round(data.assessment.combined.fraction * 100)}% of the allowance</span>{" "}
          <span className="text-ink-soft">(each agent&apos;s share of its own maximum, added, because the toxicity adds up).</span></p>
      ) : null}
      {data && data.entries.length ? (
        <ul className="divide-y divide-rule rounded-md border border-rule">
          {data.entries.map((d) => (
            <li key={d.id} className="flex flex-wrap items-center justify-between gap-2 px-3 py-2">
              <span className="tabular-nums">{AGENT_WORDS[d.agent]} {d.concentrationPct}% × {d.volumeMl} mL {d.withEpinephrine ? "with" : "without"} epinephrine = <span className="font-bold">{round1(d.doseMg)} mg</span>
                {d.overrideReason ? <span className="block text-sm">△ Over the maximum, recorded reason: {d.overrideReason}</span> : null}</span>
              {canEdit ? <Button variant="ghost" onClick={() => remove(d.id)} aria-label={`Remove ${AGENT_WORDS[d.agent]} ${d.volumeMl} mL`}>Remove</Button> : null}
            </li>
          ))}
        </ul>
      ) : data ? <p className="text-sm text-ink-soft">No injections recorded.</p> : null}
      {canEdit ? (
        <form onSubmit={add} noValidate className="grid gap-3 sm:grid-cols-4">
          <Field id="dose-agent" label="Agent" error={fields.agent?.[0]}>
            <select id="dose-agent" className={inputClass} value={agent} onChange={(e) => setAgent(e.target.value as AnaestheticAgent)}>
              {ANAESTHETIC_AGENTS.map((a) => <option key={a} value={a}>{AGENT_WORDS[a]}</option>)}
            </select>
          </Field>
          <Field id="dose-pct" label="Concentration (%)" error={fields.concentrationPct?.[0]}>
            <input id="dose-pct" type="number" inputMode="decimal" step="0.05" className={inputClass} value={pct} onChange={(e) => setPct(e.target.value)} />
          </Field>
          <Field id="dose-ml" label="Volume (mL)" error={fields.volumeMl?.[0]}>
            <input id="dose-ml" type="number" inputMode="decimal" step="0.5" className={inputClass} value={ml} onChange={(e) => setMl(e.target.value)} />
          </Field>
          <div className="flex items-end">
            <label className="flex min-h-11 items-center gap-2 font-semibold">
              <input type="checkbox" className="h-6 w-6" checked={epi} onChange={(e) => setEpi(e.target.checked)} /> With epinephrine
            </label>
          </div>
          {valid ? <p className="text-sm sm:col-span-4">This entry: <span className="font-bold tabular-nums">{round1(mgFromPercentAndMl(entry.concentrationPct, entry.volumeMl))} mg</span></p> : null}
          {preview?.near ? <div className="sm:col-span-4"><Caution title="Close to the maximum">{preview.message} {STATEMENT}</Caution></div> : null}
          {preview?.over || fields.overrideReason ? (
            <div className="flex flex-col gap-2 sm:col-span-4">
              <Caution tone="danger" title="Over the maximum">{preview?.message ?? fields.overrideReason?.[0]} {STATEMENT} To record it anyway, give the reason; it is kept with your name.</Caution>
              <Field id="dose-reason" label="Reason for going over the maximum" error={fields.overrideReason?.[0]}>
                <input id="dose-reason" className={inputClass} value={reason} onChange={(e) => setReason(e.target.value)} />
              </Field>
            </div>
          ) : null}
          <div className="sm:col-span-4"><Button type="submit" disabled={busy || !valid}>{busy ? "Saving…" : "Add injection"}</Button></div>
          <div className="sm:col-span-4"><FormError message={serverError} /></div>
        </form>
      ) : null}
    </Section>
  );
}
