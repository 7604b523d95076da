"use client";
import { useState } from "react";
import useSWR, { mutate } from "swr";
import { ApiError, fetcher, sendJson } from "@/components/data/fetcher";
import { Button } from "@/components/ui/button";
import { Caution } from "@/components/ui/caution";
import { FormError, Section } from "./field";
import { formatDateTime } from "./labels";
import { api } from "@/components/data/keys";

interface Dto {
  suggestions: { code: string; descriptor: string; why: string }[];
  cautions: string[];
  confirmed: { code: string; descriptor: string; confirmedAt: string; confirmedByName: string }[];
}

/** ICD-10-CM codes suggested from the findings; nothing is coded until the clinician confirms it. */
export function DiagnosesPanel({ visitId, canEdit }: { visitId: string; canEdit: boolean }) {
  const key = api.visitPart(visitId, "diagnoses");
  const { data, error } = useSWR<Dto>(key, fetcher);
  const [serverError, setServerError] = useState<string | null>(null);

  async function act(method: "POST" | "DELETE", code: string) {
    setServerError(null);
    try {
      await sendJson(method, method === "POST" ? key : `${key}?code=${encodeURIComponent(code)}`, method === "POST" ? { code } : undefined);
      await mutate(key);
    } catch (err) { setServerError(err instanceof ApiError ? err.message : "The code could not be changed."); }
  }

  const confirmed = new Map(data?.confirmed.map((c) => [c.code, c]) ?? []);
  const why = new Map(data?.suggestions.map((s) => [s.code, s.why]) ?? []);
  const rows = [...(data?.suggestions ?? []), ...(data?.confirmed.filter((c) => !why.has(c.code)).map((c) => ({ code: c.code, descriptor: c.descriptor, why: "No longer suggested by the current findings" })) ?? [])];

  return (
    <Section id="diagnoses" title="ICD-10-CM codes">
      <p className="text-sm text-ink-soft">Suggested from this visit&apos;s findings, histology, cytology and HPV result. Confirm each code you agree with.</p>
      {error ? <FormError message={error.message} /> : null}
      {data?.cautions.map((c) => <Caution key={c} title="For the coder">{c}</Caution>)}
      {rows.length ? (
        <ul className="divide-y divide-rule rounded-md border border-rule">
          {rows.map((s) => {
            const c = confirmed.get(s.code);
            return (
              <li key={s.code} className="flex flex-wrap items-center justify-between gap-2 px-3 py-2">
                <div>
                  <p><span className="font-bold tabular-nums">{s.code}</span> {s.descriptor}</p>
                  <p className="text-sm text-ink-soft">Why: {s.why}</p>
                  <p className="text-sm font-semibold">{c ? `✓ Confirmed by ${c.confirmedByName}, ${formatDateTime(c.confirmedAt)}` : "○ Suggested, not confirmed"}</p>
                </div>
                {canEdit ? (c
                  ? <Button variant="ghost" onClick={() => act("DELETE", s.code)}>Withdraw</Button>
                  : <Button variant="secondary" onClick={() => act("POST", s.code)}>Confirm {s.code}</Button>) : null}
              </li>
            );
          })}
        </ul>
      ) : data ? <p className="text-sm text-ink-soft">No codes suggested by the findings so far.</p> : null}
      <FormError message={serverError} />
    </Section>
  );
}
