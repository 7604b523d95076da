"use client";

import { useState } from "react";
import { useRouter } from "next/navigation";
import { Controller, useForm } from "react-hook-form";
import { plainResolver } from "@/components/ui/plain-resolver";
import type { z } from "zod";
import { Button } from "@/components/ui/button";
import { sendJson } from "@/components/data/fetcher";
import { studySchema } from "@/lib/validation/studies";
import { ISO_DATE_INPUT } from "@/components/ui/date-input";

type In = z.input<typeof studySchema>;
type Out = z.output<typeof studySchema>;
export interface StudyValues { id: string; code: string; title: string; startDate: string; consentFormVersion: string; siteIds: string[] }

/** Sets a study up (no `study`) or edits one; sites are offered among the user's own. */
export function StudyForm({ study, sites }: { study?: StudyValues; sites: { id: string; code: string; name: string }[] }) {
  const router = useRouter();
  const [message, setMessage] = useState<string | null>(null);
  const form = useForm<In, unknown, Out>({
    resolver: plainResolver(studySchema),
    defaultValues: study ? { ...study, siteIds: study.siteIds.filter((s) => sites.some((x) => x.id === s)) } : { code: "", title: "", startDate: "", consentFormVersion: "1", siteIds: sites.length === 1 ? [sites[0]!.id] : [] },
  });
  const e = form.formState.errors;
  async function submit(values: Out) {
    setMessage(null);
    try {
      const r = await sendJson<{ study: { id: string } }>(study ? "PATCH" : "POST", study ? `/api/studies/${study.id}` : "/api/studies", values);
      if (study) {
        setMessage("Saved.");
        router.refresh();
      } else router.push(`/studies/${r.study.id}`);
    } catch (err) {
      const x = err as { message?: string; fields?: Record<string, string[]> };
      for (const [f, m] of Object.entries(x.fields ?? {})) if (f in values) form.setError(f as keyof In, { message: m[0] });
      setMessage(x.message ?? "Not saved.");
    }
  }
  const id = (n: string) => `${study?.id ?? "new"}-study-${n}`;
  const text = (name: "code" | "title" | "startDate" | "consentFormVersion", label: string, extra: { type?: string; width: string }) => (
    <div className={extra.width}>
      <label htmlFor={id(name)} className="block text-sm font-semibold">{label}</label>
      <input id={id(name)} {...(extra.type === "date" ? ISO_DATE_INPUT : { type: "text" })} {...form.register(name)} aria-invalid={e[name] ? true : undefined} className="mt-1 min-h-11 w-full rounded-md border border-rule-strong bg-panel px-3" />
      {e[name] ? <p className="mt-1 text-sm text-danger-ink">{e[name]!.message}</p> : null}
    </div>
  );
  return (
    <form onSubmit={form.handleSubmit(submit)} noValidate className="flex flex-wrap items-end gap-3" aria-label={study ? "Edit the study" : "New study"}>
      {text("code", "Study code", { width: "w-40" })}
      {text("title", "Title", { width: "min-w-72 flex-1" })}
      {text("startDate", "Start date", { type: "date", width: "w-44" })}
      {text("consentFormVersion", "Consent form version", { width: "w-44" })}
      <Controller control={form.control} name="siteIds" render={({ field }) => (
        <fieldset className="w-full">
          <legend className="text-sm font-semibold">Sites</legend>
          <div className="flex flex-wrap gap-4">
            {sites.map((s) => (
              <label key={s.id} className="inline-flex min-h-11 items-center gap-2">
                <input type="checkbox" className="h-5 w-5" checked={field.value.includes(s.id)}
                  onChange={(ev) => field.onChange(ev.target.checked ? [...field.value, s.id] : field.value.filter((x: string) => x !== s.id))} />
                {s.name} ({s.code})
              </label>
            ))}
          </div>
          {e.siteIds ? <p className="mt-1 text-sm text-danger-ink">{e.siteIds.message}</p> : null}
        </fieldset>
      )} />
      <Button type="submit" disabled={form.formState.isSubmitting}>{study ? "Save the study" : "Set up the study"}</Button>
      {message ? <p role="status" className="w-full text-sm">{message}</p> : null}
    </form>
  );
}
