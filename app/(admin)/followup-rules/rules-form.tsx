"use client";

import { useState } from "react";
import { useRouter } from "next/navigation";
import { Button } from "@/components/ui/button";
import { monthsWord } from "@/lib/due-dates/rule-words";

interface Rule { key: string; title: string; basis: string; defaultMonths: number }

export function RulesForm({ siteId, rules, current }: { siteId: string; rules: Rule[]; current: Record<string, number | undefined> }) {
  const router = useRouter();
  const [pending, setPending] = useState(false);
  const [result, setResult] = useState<{ ok: boolean; text: string; fields?: Record<string, string[]> } | null>(null);

  async function submit(form: FormData) {
    setPending(true);
    const table: Record<string, number> = {};
    for (const r of rules) {
      const raw = String(form.get(r.key) ?? "").trim();
      if (raw !== "") table[r.key] = Number(raw);
    }
    const res = await fetch("/api/admin/followup-rules", { method: "PUT", headers: { "content-type": "application/json" }, body: JSON.stringify({ siteId, rules: table }) }).catch(() => null);
    const body = res ? await res.json().catch(() => null) : null;
    setResult(res?.ok ? { ok: true, text: "Saved." } : { ok: false, text: body?.error?.message ?? "The service is briefly unavailable.", fields: body?.error?.fields });
    setPending(false);
    if (res?.ok) router.refresh();
  }

  return (
    <form onSubmit={(e) => { e.preventDefault(); void submit(new FormData(e.currentTarget)); }} className="mt-3" noValidate>
      <table className="w-full border-collapse text-left">
        <thead className="border-b border-rule text-sm"><tr><th className="py-2 pr-3">Situation</th><th className="py-2 pr-3">Months</th><th className="py-2 pr-3">Default and its basis</th></tr></thead>
        <tbody>
          {rules.map((r) => {
            const err = result?.fields?.[`rules.${r.key}`]?.[0];
            return (
              <tr key={r.key} className="border-b border-rule last:border-0">
                <td className="py-2 pr-3"><label htmlFor={`${siteId}-${r.key}`} className="font-semibold">{r.title}</label></td>
                <td className="py-2 pr-3">
                  <input id={`${siteId}-${r.key}`} name={r.key} type="number" min={1} max={36} step={1} inputMode="numeric" defaultValue={current[r.key] ?? ""} placeholder={String(r.defaultMonths)}
                    aria-invalid={!!err} className="min-h-11 w-24 rounded-md border border-rule-strong bg-panel px-2 tabular-nums" />
                  {err ? <p className="mt-1 text-sm text-danger-ink">{err}</p> : null}
                </td>
                <td className="py-2 pr-3 text-sm text-ink-soft">{monthsWord(r.defaultMonths)} · {r.basis}</td>
              </tr>
            );
          })}
        </tbody>
      </table>
      <div className="mt-3 flex items-center gap-3">
        <Button type="submit" disabled={pending}>{pending ? "Saving…" : "Save rules"}</Button>
        {result ? <p role={result.ok ? "status" : "alert"} className={result.ok ? "text-ok-ink" : "text-danger-ink"}>{result.text}</p> : null}
      </div>
    </form>
  );
}
