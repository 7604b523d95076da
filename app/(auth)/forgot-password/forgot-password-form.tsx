"use client";

import { useState } from "react";
import { Button } from "@/components/ui/button";

export function ForgotPasswordForm() {
  const [pending, setPending] = useState(false);
  const [answer, setAnswer] = useState<{ ok: boolean; text: string } | null>(null);

  async function submit(form: FormData) {
    setPending(true);
    const res = await fetch("/api/auth/forgot-password", {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify({ email: form.get("email") }),
    }).catch(() => null);
    const body = res ? await res.json().catch(() => null) : null;
    setAnswer(res?.ok ? { ok: true, text: body.message } : { ok: false, text: body?.error?.fields?.email?.[0] ?? body?.error?.message ?? "The service is briefly unavailable. Try again in a moment." });
    setPending(false);
  }

  return (
    <form onSubmit={(e) => { e.preventDefault(); void submit(new FormData(e.currentTarget)); }} className="space-y-4" noValidate>
      <div>
        <label htmlFor="email" className="block font-semibold">E-mail</label>
        <input id="email" name="email" type="email" autoComplete="username" required className="mt-1 min-h-11 w-full rounded-md border border-rule-strong bg-panel px-3" />
      </div>
      {answer ? <p role="status" className={`rounded-md px-3 py-2 ${answer.ok ? "bg-lagoon-50 text-ink" : "bg-danger-bg text-danger-ink"}`}>{answer.text}</p> : null}
      <Button type="submit" disabled={pending} className="w-full">{pending ? "Sending…" : "Send reset link"}</Button>
    </form>
  );
}
