"use client";
import { useState } from "react";
import useSWR, { mutate } from "swr";
import { ApiError, fetcher, sendJson } from "@/components/data/fetcher";
import { Button } from "@/components/ui/button";
import type { VisitPermissions } from "@/lib/validation/visit-record";
import { Field, FormError, inputClass, Section } from "./field";
import { formatDateTime } from "./labels";
import { visitKey, type VisitRecordDto } from "./use-visit-record";
import { api } from "@/components/data/keys";
import type { DisplayConvention } from "@/lib/geometry";
import { SigningPrompt } from "./signing-prompt";

interface Addendum { id: string; body: string; authorName: string; createdAt: string }

export function SigningPanel({ visit, permissions, conv }: { visit: VisitRecordDto; permissions: VisitPermissions; conv: DisplayConvention }) {
  const addendaKey = api.visitPart(visit.id, "addenda");
  const { data } = useSWR<{ addenda: Addendum[] }>(visit.status === "signed" ? addendaKey : null, fetcher);
  const [confirming, setConfirming] = useState(false);
  const [body, setBody] = useState("");
  const [fields, setFields] = useState<Record<string, string[]>>({});
  const [serverError, setServerError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function sign() {
    setBusy(true); setServerError(null);
    try {
      await sendJson("POST", api.visitPart(visit.id, "sign"));
      setConfirming(false);
      // Every panel turns read-only: refresh everything under this visit.
      await mutate((k) => typeof k === "string" && k.startsWith(visitKey(visit.id)));
    } catch (err) {
      setServerError(err instanceof ApiError ? err.message : "The visit could not be signed.");
      // Refused for an undecided earlier track (someone changed the tracks meanwhile): show the list again.
      if (err instanceof ApiError && err.status === 409) await mutate(api.visitPart(visit.id, "tracks"));
    }
    finally { setBusy(false); }
  }

  async function addAddendum(e: React.FormEvent) {
    e.preventDefault();
    setBusy(true); setFields({}); setServerError(null);
    try {
      await sendJson("POST", addendaKey, { body });
      setBody("");
      await mutate(addendaKey);
    } catch (err) {
      if (err instanceof ApiError) { setFields(err.fields ?? {}); setServerError(err.fields ? null : err.message); } else setServerError("The addendum could not be saved.");
    } finally { setBusy(false); }
  }

  if (visit.status === "draft") {
    return (
      <Section id="signing" title="Signature">
        <p className="text-sm">○ Draft. Once signed, the record can no longer be changed; later words go in addenda with their author and time.</p>
        {permissions.canSign ? (
          confirming ? (
            <SigningPrompt visitId={visit.id} conv={conv} busy={busy} onSign={sign} onCancel={() => setConfirming(false)} />
          ) : <div><Button onClick={() => setConfirming(true)}>Sign visit…</Button></div>
        ) : <p className="text-sm text-ink-soft">Only the examining clinician ({visit.examinerName}) or an admin can sign this visit.</p>}
        <FormError message={serverError} />
      </Section>
    );
  }

  return (
    <Section id="signing" title="Signature and addenda">
      <p className="font-semibold">✓ Signed by {visit.signedByName ?? "—"}, {formatDateTime(visit.signedAt)}</p>
      {data?.addenda.length ? (
        <ol className="flex flex-col gap-2">
          {data.addenda.map((a, i) => (
            <li key={a.id} className="rounded-md border border-rule px-3 py-2">
              <p className="text-sm text-ink-soft">Addendum {i + 1} · {a.authorName} · {formatDateTime(a.createdAt)}</p>
              <p className="whitespace-pre-wrap">{a.body}</p>
            </li>
          ))}
        </ol>
      ) : <p className="text-sm text-ink-soft">No addenda.</p>}
      {permissions.canAddAddendum ? (
        <form onSubmit={addAddendum} noValidate className="flex flex-col gap-2">
          <Field id="addendum-body" label="New addendum" error={fields.body?.[0]}>
            <textarea id="addendum-body" rows={3} className={`${inputClass} py-2`} value={body} onChange={(e) => setBody(e.target.value)} />
          </Field>
          <div><Button type="submit" disabled={busy}>{busy ? "Saving…" : "Add addendum"}</Button></div>
        </form>
      ) : null}
      <FormError message={serverError} />
    </Section>
  );
}
