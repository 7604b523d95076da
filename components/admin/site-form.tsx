"use client";

import { useState } from "react";
import { useRouter } from "next/navigation";
import { useForm } from "react-hook-form";
import { plainResolver } from "@/components/ui/plain-resolver";
import type { z } from "zod";
import { Button } from "@/components/ui/button";
import { sendJson } from "@/components/data/fetcher";
import { siteSchema } from "@/lib/validation/sites";

export interface SiteRow {
  id: string;
  code: string;
  name: string;
  timeZone: string;
  postalCode: string | null;
  version: number;
}

type In = z.input<typeof siteSchema>;
type Out = z.output<typeof siteSchema>;

const FIELDS: { name: keyof In; label: string; hint?: string; width: string }[] = [
  { name: "name", label: "Site name", width: "min-w-64 flex-1" },
  { name: "code", label: "Short code", hint: "2–8 letters or digits, unique", width: "w-32" },
  { name: "timeZone", label: "Time zone", hint: "e.g. America/Chicago", width: "w-56" },
  { name: "postalCode", label: "ZIP or postal code", hint: "optional", width: "w-40" },
];

/** Creates a site (no `site`) or edits one; the server checks the same schema and the code's uniqueness. */
export function SiteForm({ site }: { site?: SiteRow }) {
  const router = useRouter();
  const [message, setMessage] = useState<string | null>(null);
  const form = useForm<In, unknown, Out>({
    resolver: plainResolver(siteSchema),
    defaultValues: site ? { name: site.name, code: site.code, timeZone: site.timeZone, postalCode: site.postalCode ?? "" } : { name: "", code: "", timeZone: "", postalCode: "" },
  });
  const errors = form.formState.errors;
  async function submit(values: Out) {
    setMessage(null);
    try {
      if (site) await sendJson("PATCH", `/api/admin/sites/${site.id}`, { ...values, version: site.version });
      else await sendJson("POST", "/api/admin/sites", values);
      if (!site) form.reset();
      setMessage(site ? "Saved." : `Site ${values.code} created; you work there now.`);
      router.refresh();
    } catch (err) {
      const e = err as { message?: string; fields?: Record<string, string[]> };
      for (const [field, msgs] of Object.entries(e.fields ?? {})) if (field in values) form.setError(field as keyof In, { message: msgs[0] });
      setMessage(e.message ?? "Not saved.");
    }
  }
  const idOf = (n: string) => `${site?.id ?? "new"}-${n}`;
  return (
    <form onSubmit={form.handleSubmit(submit)} noValidate className="flex flex-wrap items-end gap-3" aria-label={site ? `Edit ${site.name}` : "New site"}>
      {FIELDS.map((f) => (
        <div key={f.name} className={f.width}>
          <label htmlFor={idOf(f.name)} className="block text-sm font-semibold">{f.label}</label>
          <input id={idOf(f.name)} {...form.register(f.name)} aria-invalid={errors[f.name] ? true : undefined} aria-describedby={f.hint ? idOf(`${f.name}-hint`) : undefined}
            className="mt-1 min-h-11 w-full rounded-md border border-rule-strong bg-panel px-3" />
          {f.hint ? <p id={idOf(`${f.name}-hint`)} className="mt-1 h-5 text-xs text-ink-soft">{f.hint}</p> : <p className="mt-1 h-5" aria-hidden="true" />}
          {errors[f.name] ? <p className="mt-1 text-sm text-danger-ink">{errors[f.name]!.message}</p> : null}
        </div>
      ))}
      <div className="pb-6"><Button type="submit" disabled={form.formState.isSubmitting}>{site ? "Save" : "Create site"}</Button></div>
      {message ? <p role="status" className="w-full text-sm">{message}</p> : null}
    </form>
  );
}
