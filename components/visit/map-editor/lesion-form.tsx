"use client";
// The inspector for the selected lesion. One schema (lesionFieldsSchema; the form adds the whole-circumference rule) for the form and the
// route. Choices save as soon as they are made; typed fields save on leaving the field or Enter.
import { useEffect, useRef } from "react";
import { Controller, useForm, useWatch, type Control } from "react-hook-form";
import { plainResolver } from "@/components/ui/plain-resolver";
import type { z } from "zod";
import { Caution } from "@/components/ui/caution";
import { GRADE_ENCODING } from "@/components/canal-map";
import { GRADE_LABEL, GRADES, HISTOLOGY_AS_GRADE, HISTOLOGY_LABEL } from "@/lib/domain/vocab";
import { fullCircle, isFullCircle, type DisplayConvention } from "@/lib/geometry";
import { ClockField } from "./clock-field";
import { lesionFieldsSchema, lesionFormSchema, type LesionDto } from "@/lib/validation/lesions";
import type { LesionPatch } from "./use-lesion-store";
import { SaveLine } from "./save-line";
import type { SaveInfo } from "./use-lesion-store";

type In = z.input<typeof lesionFieldsSchema>;
type Out = z.output<typeof lesionFieldsSchema>;

const MORPHOLOGY = [["flat", "Flat"], ["raised", "Raised"], ["papillary", "Papillary"], ["ulcerated", "Ulcerated"]] as const;
const ACETOWHITE = [["none", "None"], ["faint", "Faint"], ["dense", "Dense"]] as const;
const LUGOL = [["not_applied", "Not applied"], ["negative", "Negative (unstained)"], ["partial", "Partial"], ["positive", "Positive (brown)"]] as const;
const VESSELS = [["punctation", "Punctation"], ["mosaic", "Mosaic"], ["atypical", "Atypical vessels"]] as const;

const KEYS = ["clockStartH", "clockEndH", "distanceStartCm", "distanceEndCm", "grade", "morphology", "acetowhite", "lugol", "vessels", "sizeMm", "note"] as const;
const valuesOf = (l: LesionDto): In => Object.fromEntries(KEYS.map((k) => [k, l[k]])) as In;

function diff(v: Out, l: LesionDto): LesionPatch {
  const out: Record<string, unknown> = {};
  for (const k of KEYS) {
    const a = v[k] ?? null;
    const b = l[k] ?? null;
    if (JSON.stringify(a) !== JSON.stringify(b)) out[k] = v[k] ?? null;
  }
  return out as LesionPatch;
}

export interface LesionFormProps {
  lesion: LesionDto;
  convention: DisplayConvention;
  readOnly: boolean;
  saveInfo?: SaveInfo;
  onCommit: (patch: LesionPatch) => void;
  onDelete: () => void;
}

export function LesionForm({ lesion, convention, readOnly, saveInfo, onCommit, onDelete }: LesionFormProps) {
  const form = useForm<In, unknown, Out>({ resolver: plainResolver(lesionFormSchema), defaultValues: valuesOf(lesion), mode: "onChange" });
  const { register, control, handleSubmit, reset, formState, setValue } = form;

  // The map may change the lesion (drag, keys): take those values, keep what is being typed.
  // Not on mount: the defaults are already this lesion's values.
  const shownLesion = useRef(lesion);
  useEffect(() => {
    if (shownLesion.current === lesion) return;
    shownLesion.current = lesion;
    reset(valuesOf(lesion), { keepDirtyValues: true });
  }, [lesion, reset]);

  const save = handleSubmit((v) => {
    const lo = Math.min(v.distanceStartCm, v.distanceEndCm);
    const hi = Math.max(v.distanceStartCm, v.distanceEndCm);
    const next = { ...v, distanceStartCm: lo, distanceEndCm: hi };
    const patch = diff(next, lesion);
    reset(next);
    if (Object.keys(patch).length) onCommit(patch);
  });
  const grade = useWatch({ control, name: "grade" });
  const [clockStart, clockEnd] = useWatch({ control, name: ["clockStartH", "clockEndH"] });
  const whole = isFullCircle({ startH: Number(clockStart), endH: Number(clockEnd) });
  // Unticking the whole circumference gives back the arc drawn before it was ticked (else 12 → 1).
  const beforeWhole = useRef<{ startH: number; endH: number } | null>(null);
  function setWhole(on: boolean) {
    if (on) beforeWhole.current = { startH: Number(clockStart), endH: Number(clockEnd) };
    const arc = on ? fullCircle() : (beforeWhole.current ?? { startH: 0, endH: 1 });
    setValue("clockStartH", arc.startH, { shouldDirty: true });
    setValue("clockEndH", arc.endH, { shouldDirty: true });
    void save();
  }
  const err = (k: keyof In) => formState.errors[k]?.message as string | undefined;
  const histGrade = lesion.histology ? HISTOLOGY_AS_GRADE[lesion.histology] : null;

  return (
    <form onSubmit={(e) => void save(e)} aria-label={`Lesion ${lesion.label}`} className="space-y-3">
      <div className="flex items-baseline justify-between gap-2">
        <h2 className="text-lg font-bold">Lesion {lesion.label}</h2>
        <SaveLine info={saveInfo} pending={lesion.version === 0} />
      </div>
      <fieldset disabled={readOnly} className="space-y-3 disabled:opacity-80">
        <Controller control={control} name="grade" render={({ field }) => (
          <Choices legend="Impression grade" value={field.value} options={GRADES.map((g) => [g, GRADE_LABEL[g]] as const)} onPick={(v) => { field.onChange(v); void save(); }} swatch />
        )} />
        {lesion.histology === "scc" ? (
          <Caution tone="danger" title="Squamous cell carcinoma on histology">
            Confirmed by biopsy. Refer without delay following your local cancer pathway; the clinician decides.
          </Caution>
        ) : grade === "suspected_cancer" ? (
          <Caution tone="danger" title="Suspected cancer: needs urgent histological confirmation">
            Arrange biopsy and onward referral according to local protocol. The impression alone does not diagnose; the clinician decides.
          </Caution>
        ) : null}
        <label className="inline-flex min-h-11 items-center gap-2 text-sm font-semibold">
          <input type="checkbox" className="size-5" checked={whole} onChange={(e) => setWhole(e.target.checked)} />
          Whole circumference
        </label>
        {whole ? <p className="text-sm">Clock: the whole circumference (12 of 12 clock hours).{err("clockEndH") ? <span role="alert" className="text-danger-ink"> {err("clockEndH")}</span> : null}</p> : null}
        <div className="grid grid-cols-2 gap-2">
          {whole ? null : <>
            <ClockField control={control} name="clockStartH" label="Clock from" conv={convention} onDone={() => void save()} error={err("clockStartH")} />
            <ClockField control={control} name="clockEndH" label="Clock to (clockwise)" conv={convention} onDone={() => void save()} error={err("clockEndH")} />
          </>}
          <NumberField label="From (cm from verge)" error={err("distanceStartCm")} {...register("distanceStartCm", { valueAsNumber: true, onBlur: () => void save() })} />
          <NumberField label="To (cm from verge)" error={err("distanceEndCm")} {...register("distanceEndCm", { valueAsNumber: true, onBlur: () => void save() })} />
        </div>
        <p className="text-xs text-ink-soft">Negative cm = perianal skin outside the verge.</p>
        <Nullable control={control} name="morphology" legend="Surface contour" options={MORPHOLOGY} onPicked={() => void save()} />
        <Nullable control={control} name="acetowhite" legend="Acetowhite change" options={ACETOWHITE} onPicked={() => void save()} />
        <Nullable control={control} name="lugol" legend="Lugol's iodine uptake" options={LUGOL} onPicked={() => void save()} />
        <fieldset>
          <legend className="text-sm font-semibold">Vessels</legend>
          <div className="mt-1 flex flex-wrap gap-2">
            {VESSELS.map(([v, label]) => (
              <label key={v} className="inline-flex min-h-11 items-center gap-2 rounded-md border border-rule-strong bg-panel px-3">
                <input type="checkbox" value={v} className="size-5" {...register("vessels", { onChange: () => void save() })} />
                {label}
              </label>
            ))}
          </div>
        </fieldset>
        <NumberField label="Size (mm)" error={err("sizeMm")} {...register("sizeMm", { setValueAs: (x: unknown) => (x === "" || x === null ? null : Number(x)), onBlur: () => void save() })} />
        <label className="block text-sm font-semibold">
          Note
          <textarea rows={2} className="mt-1 block w-full rounded-md border border-rule-strong bg-panel p-2 font-normal" {...register("note", { setValueAs: (x: unknown) => (x === "" ? null : x), onBlur: () => void save() })} />
          {err("note") ? <span role="alert" className="text-danger-ink">{err("note")}</span> : null}
        </label>
      </fieldset>
      <dl className="space-y-1 rounded-md bg-lagoon-50 p-2 text-sm">
        <div><dt className="inline font-semibold">Biopsy: </dt><dd className="inline">{lesion.biopsyLabels.length ? `specimen ${lesion.biopsyLabels.join(", ")}` : "none taken"}</dd></div>
        <div>
          <dt className="inline font-semibold">Histology: </dt>
          <dd className="inline">
            {!lesion.histology ? "no result yet" : histGrade !== lesion.grade
              ? `Impression ${GRADE_LABEL[lesion.grade]} · Histology ${HISTOLOGY_LABEL[lesion.histology]} (histology decides for tracking)`
              : `${HISTOLOGY_LABEL[lesion.histology]} (agrees with the impression)`}
          </dd>
        </div>
        {lesion.zone ? <div><dt className="inline font-semibold">Zone: </dt><dd className="inline">{lesion.zone.replace(/_/g, " ")}</dd></div> : null}
      </dl>
      {!readOnly ? (
        <button type="button" onClick={onDelete} className="min-h-11 rounded-md border border-danger-rule px-4 font-semibold text-danger-ink hover:bg-danger-bg">
          Delete lesion {lesion.label}
        </button>
      ) : null}
    </form>
  );
}

function Choices<V extends string>({ legend, value, options, onPick, swatch }: { legend: string; value: V | null | undefined; options: ReadonlyArray<readonly [V | "", string]>; onPick: (v: V | "") => void; swatch?: boolean }) {
  return (
    <fieldset>
      <legend className="text-sm font-semibold">{legend}</legend>
      <div className="mt-1 flex flex-wrap gap-2">
        {options.map(([v, label]) => {
          const on = (value ?? "") === v;
          return (
            <label key={v === "" ? "_unset" : v} className={`inline-flex min-h-11 cursor-pointer items-center gap-2 rounded-md border px-3 ${on ? "border-lagoon-600 bg-lagoon-50 font-semibold" : "border-rule-strong bg-panel"}`}>
              <input type="radio" className="size-5" checked={on} onChange={() => onPick(v)} value={v} name={legend} />
              {swatch && v ? <span aria-hidden="true" className="inline-block size-3 rounded-full" style={{ background: GRADE_ENCODING[v as (typeof GRADES)[number]].hue }} /> : null}
              {label}
            </label>
          );
        })}
      </div>
    </fieldset>
  );
}

function Nullable({ control, name, legend, options, onPicked }: { control: Control<In, unknown, Out>; name: "morphology" | "acetowhite" | "lugol"; legend: string; options: ReadonlyArray<readonly [string, string]>; onPicked: () => void }) {
  return (
    <Controller control={control} name={name} render={({ field }) => (
      <Choices legend={legend} value={field.value ?? ""} options={[["", "Not recorded"], ...options]} onPick={(v) => { field.onChange(v === "" ? null : v); onPicked(); }} />
    )} />
  );
}

function NumberField({ label, error, ...input }: { label: string; error?: string } & React.InputHTMLAttributes<HTMLInputElement> & { ref?: React.Ref<HTMLInputElement> }) {
  return (
    <label className="block text-sm font-semibold">
      {label}
      <input type="number" step="0.5" inputMode="decimal" className="mt-1 block min-h-11 w-full rounded-md border border-rule-strong bg-panel px-2 text-base font-normal" {...input} />
      {error ? <span role="alert" className="text-danger-ink">{error}</span> : null}
    </label>
  );
}
