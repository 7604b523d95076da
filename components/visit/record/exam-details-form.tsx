"use client";
import { useState } from "react";
import { useForm, useWatch, type Path } from "react-hook-form";
import { plainResolver } from "@/components/ui/plain-resolver";
import type { z } from "zod";
import { mutate } from "swr";
import { ApiError, sendJson } from "@/components/data/fetcher";
import { Button } from "@/components/ui/button";
import { ADEQUACY, CYTOLOGY, HPV_RESULTS, POSITIONS } from "@/lib/domain/vocab";
import { examDetailsSchema } from "@/lib/validation/visit-record";
import { Field, FormError, inputClass, Section } from "./field";
import { ADEQUACY_WORDS, CYTOLOGY_WORDS, HPV_WORDS, POSITION_WORDS } from "@/lib/domain/labels";
import { visitKey, type VisitRecordDto } from "./use-visit-record";
import { api } from "@/components/data/keys";
import { ISO_DATE_INPUT } from "@/components/ui/date-input";

type In = z.input<typeof examDetailsSchema>;
type Out = z.output<typeof examDetailsSchema>;

const blankToNull = (v: unknown) => (v === "" || v === undefined ? null : v);
const numberOrNull = (v: unknown) => (v === "" || v === null || v === undefined ? null : Number(v));
const pad = (n: number) => String(n).padStart(2, "0");

/** "HH:MM" in the browser's time zone for an ISO instant. */
function clockOf(iso: string | null | undefined) {
  if (!iso) return "";
  const d = new Date(iso);
  return `${pad(d.getHours())}:${pad(d.getMinutes())}`;
}
/** The instant of a local time of day on the visit date. */
function instantOf(date: string, hhmm: string) {
  if (!hhmm || !/^\d{4}-\d{2}-\d{2}$/.test(date)) return null;
  return new Date(`${date}T${hhmm}:00`).toISOString();
}

function defaults(v: VisitRecordDto): In {
  return {
    visitDate: v.visitDate, patientPosition: v.patientPosition, indication: v.indication, cytology: v.cytology, hpvResult: v.hpvResult,
    adequacy: v.adequacy, examStartedAt: v.examStartedAt, examEndedAt: v.examEndedAt, anaesthesia: v.anaesthesia,
    patientWeightKg: v.patientWeightKg, plan: v.plan, version: v.version,
  };
}

export function ExamDetailsForm({ visit, canEdit }: { visit: VisitRecordDto; canEdit: boolean }) {
  const form = useForm<In, unknown, Out>({ resolver: plainResolver(examDetailsSchema), values: defaults(visit) });
  const { register, handleSubmit, formState, setError, setValue, control } = form;
  const [serverError, setServerError] = useState<string | null>(null);
  const [saved, setSaved] = useState(false);
  const err = (k: keyof In) => formState.errors[k]?.message as string | undefined;
  const date = useWatch({ control, name: "visitDate" });

  const onSubmit = handleSubmit(async (values) => {
    setServerError(null);
    setSaved(false);
    try {
      const res = await sendJson<{ visit: VisitRecordDto }>("PATCH", visitKey(visit.id), values);
      await mutate(visitKey(visit.id), (cur: object | undefined) => ({ ...cur, visit: res.visit }), { revalidate: true });
      await Promise.all([mutate(api.visitPart(visit.id, "anaesthetic")), mutate(api.visitPart(visit.id, "diagnoses"))]);
      setSaved(true);
    } catch (e) {
      if (e instanceof ApiError && e.fields) for (const [k, msgs] of Object.entries(e.fields)) setError(k as Path<In>, { message: msgs[0] });
      setServerError(e instanceof ApiError ? e.message : "The details could not be saved.");
      if (e instanceof ApiError && e.code === "conflict") await mutate(visitKey(visit.id));
    }
  });

  const timeInput = (name: "examStartedAt" | "examEndedAt", label: string) => (
    <Field id={name} label={label} error={err(name)}>
      <input id={name} type="time" className={inputClass} aria-invalid={!!err(name)} defaultValue={clockOf(visit[name])}
        onChange={(e) => setValue(name, instantOf(date, e.target.value), { shouldDirty: true })} />
    </Field>
  );

  return (
    <Section id="exam-details" title="Exam details" aside={<p className="text-sm text-ink-soft">Examiner: <span className="font-semibold text-ink">{visit.examinerName}</span></p>}>
      <form onSubmit={onSubmit} noValidate>
        <fieldset disabled={!canEdit || formState.isSubmitting} className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
          <legend className="sr-only">Exam details</legend>
          <Field id="visitDate" label="Visit date" error={err("visitDate")}>
            <input id="visitDate" {...ISO_DATE_INPUT} className={inputClass} {...register("visitDate")} />
          </Field>
          <Field id="patientPosition" label="Patient position used" error={err("patientPosition")}>
            <select id="patientPosition" className={inputClass} {...register("patientPosition")}>
              {POSITIONS.map((p) => <option key={p} value={p}>{POSITION_WORDS[p]}</option>)}
            </select>
          </Field>
          <Field id="cytology" label="Prior anal cytology (Bethesda)" error={err("cytology")}>
            <select id="cytology" className={inputClass} {...register("cytology")}>
              {CYTOLOGY.map((c) => <option key={c} value={c}>{CYTOLOGY_WORDS[c]}</option>)}
            </select>
          </Field>
          <Field id="hpvResult" label="HPV result" error={err("hpvResult")}>
            <select id="hpvResult" className={inputClass} {...register("hpvResult")}>
              {HPV_RESULTS.map((h) => <option key={h} value={h}>{HPV_WORDS[h]}</option>)}
            </select>
          </Field>
          <Field id="adequacy" label="Exam adequacy" error={err("adequacy")}>
            <select id="adequacy" className={inputClass} {...register("adequacy", { setValueAs: blankToNull })}>
              <option value="">Not recorded</option>
              {ADEQUACY.map((a) => <option key={a} value={a}>{ADEQUACY_WORDS[a]}</option>)}
            </select>
          </Field>
          <Field id="patientWeightKg" label="Patient weight (kg)" error={err("patientWeightKg")} hint="Needed for weight-based anaesthetic limits.">
            <input id="patientWeightKg" type="number" inputMode="decimal" step="0.1" className={inputClass} {...register("patientWeightKg", { setValueAs: numberOrNull })} />
          </Field>
          {timeInput("examStartedAt", "Exam started")}
          {timeInput("examEndedAt", "Exam ended")}
          <Field id="anaesthesia" label="Anaesthesia" error={err("anaesthesia")} hint="Injections are entered below.">
            <input id="anaesthesia" className={inputClass} {...register("anaesthesia", { setValueAs: blankToNull })} />
          </Field>
          <div className="sm:col-span-2 lg:col-span-3">
            <Field id="indication" label="Indication" error={err("indication")}>
              <textarea id="indication" rows={2} className={`${inputClass} py-2`} {...register("indication", { setValueAs: blankToNull })} />
            </Field>
          </div>
          <div className="sm:col-span-2 lg:col-span-3">
            <Field id="plan" label="Plan" error={err("plan")}>
              <textarea id="plan" rows={3} className={`${inputClass} py-2`} {...register("plan", { setValueAs: blankToNull })} />
            </Field>
          </div>
        </fieldset>
        <div className="mt-3 flex flex-wrap items-center gap-3">
          {canEdit ? <Button type="submit" disabled={formState.isSubmitting}>{formState.isSubmitting ? "Saving…" : "Save exam details"}</Button> : null}
          {saved && !formState.isDirty ? <p role="status" className="text-sm font-semibold text-ok-ink">✓ Saved</p> : null}
        </div>
        <div className="mt-2"><FormError message={serverError} /></div>
      </form>
    </Section>
  );
}
