"use client";
import { useState } from "react";
import useSWR, { mutate } from "swr";
import { ApiError, fetcher, sendJson } from "@/components/data/fetcher";
import { Button } from "@/components/ui/button";
import { COMPLICATION_KINDS, SEVERITIES } from "@/lib/domain/vocab";
import { Field, FormError, inputClass, Section } from "./field";
import { COMPLICATION_WORDS, SEVERITY_WORDS } from "@/lib/domain/labels";
import { api } from "@/components/data/keys";

type Kind = (typeof COMPLICATION_KINDS)[number];
type Severity = (typeof SEVERITIES)[number];
interface Row { id: string; kind: Kind; severity: Severity; timing: "during" | "after"; note: string | null }

export function ComplicationsPanel({ visitId, canEdit }: { visitId: string; canEdit: boolean }) {
  const key = api.visitPart(visitId, "complications");
  const { data, error } = useSWR<{ complications: Row[] }>(key, fetcher);
  const [kind, setKind] = useState<Kind>("pain");
  const [severity, setSeverity] = useState<Severity>("mild");
  const [timing, setTiming] = useState<"during" | "after">("during");
  const [note, setNote] = useState("");
  const [fields, setFields] = useState<Record<string, string[]>>({});
  const [serverError, setServerError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function add(e: React.FormEvent) {
    e.preventDefault();
    setBusy(true); setFields({}); setServerError(null);
    try {
      await sendJson("POST", key, { kind, severity, timing, note: note || null });
      setNote("");
      await mutate(key);
    } catch (err) {
      if (err instanceof ApiError) { setFields(err.fields ?? {}); setServerError(err.message); } else setServerError("The complication could not be saved.");
    } finally { setBusy(false); }
  }

  async function remove(id: string) {
    try { await sendJson("DELETE", `${key}/${id}`); await mutate(key); }
    catch (err) { setServerError(err instanceof ApiError ? err.message : "The complication could not be removed."); }
  }

  return (
    <Section id="complications" title="Complications">
      {error ? <FormError message={error.message} /> : null}
      {data?.complications.length ? (
        <ul className="divide-y divide-rule rounded-md border border-rule">
          {data.complications.map((c) => (
            <li key={c.id} className="flex flex-wrap items-center justify-between gap-2 px-3 py-2">
              <span><span className="font-semibold">{COMPLICATION_WORDS[c.kind]}</span>, {SEVERITY_WORDS[c.severity].toLowerCase()}, {c.timing === "during" ? "during" : "after"} the procedure{c.note ? `: ${c.note}` : ""}</span>
              {canEdit ? <Button variant="ghost" onClick={() => remove(c.id)} aria-label={`Remove ${COMPLICATION_WORDS[c.kind]}`}>Remove</Button> : null}
            </li>
          ))}
        </ul>
      ) : data ? <p className="text-sm text-ink-soft">None recorded.</p> : null}
      {canEdit ? (
        <form onSubmit={add} noValidate className="grid gap-3 sm:grid-cols-3">
          <Field id="c-kind" label="What" error={fields.kind?.[0]}>
            <select id="c-kind" className={inputClass} value={kind} onChange={(e) => setKind(e.target.value as Kind)}>
              {COMPLICATION_KINDS.map((k) => <option key={k} value={k}>{COMPLICATION_WORDS[k]}</option>)}
            </select>
          </Field>
          <Field id="c-severity" label="Severity" error={fields.severity?.[0]}>
            <select id="c-severity" className={inputClass} value={severity} onChange={(e) => setSeverity(e.target.value as Severity)}>
              {SEVERITIES.map((s) => <option key={s} value={s}>{SEVERITY_WORDS[s]}</option>)}
            </select>
          </Field>
          <Field id="c-timing" label="When" error={fields.timing?.[0]}>
            <select id="c-timing" className={inputClass} value={timing} onChange={(e) => setTiming(e.target.value as "during" | "after")}>
              <option value="during">During the procedure</option>
              <option value="after">After the procedure</option>
            </select>
          </Field>
          <div className="sm:col-span-3"><Field id="c-note" label="Note (optional)" error={fields.note?.[0]}>
            <input id="c-note" className={inputClass} value={note} onChange={(e) => setNote(e.target.value)} />
          </Field></div>
          <div className="sm:col-span-3"><Button type="submit" variant="secondary" disabled={busy}>{busy ? "Saving…" : "Add complication"}</Button></div>
          <div className="sm:col-span-3"><FormError message={serverError} /></div>
        </form>
      ) : null}
    </Section>
  );
}
