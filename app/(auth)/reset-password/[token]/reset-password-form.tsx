"use client";

import { useState } from "react";
import { useRouter } from "next/navigation";
import { Button } from "@/components/ui/button";

export function ResetPasswordForm({ token, minChars }: { token: string; minChars: number }) {
  const router = useRouter();
  const [pending, setPending] = useState(false);
  const [problem, setProblem] = useState<{ field?: string; message?: string }>({});

  async function submit(form: FormData) {
    setPending(true);
    setProblem({});
    const res = await fetch("/api/auth/reset-password", {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify({ token, password: form.get("password") }),
    }).catch(() => null);
    if (res?.ok) {
      router.push("/sign-in?reset=1");
      return;
    }
    const body = res ? await res.json().catch(() => null) : null;
    const fields = body?.error?.fields ?? {};
    setProblem({ field: fields.password?.[0], message: fields.token?.[0] ?? body?.error?.message ?? "The service is briefly unavailable. Try again in a moment." });
    setPending(false);
  }

  return (
    <form onSubmit={(e) => { e.preventDefault(); void submit(new FormData(e.currentTarget)); }} className="space-y-4" noValidate>
      <div>
        <label htmlFor="password" className="block font-semibold">New password</label>
        <input id="password" name="password" type="password" autoComplete="new-password" required aria-invalid={!!problem.field} aria-describedby="password-hint"
          className="mt-1 min-h-11 w-full rounded-md border border-rule-strong bg-panel px-3" />
        <p id="password-hint" className="mt-1 text-sm text-ink-soft">At least {minChars} characters. Any characters, spaces too.</p>
        {problem.field ? <p className="mt-1 text-sm text-danger-ink">{problem.field}</p> : null}
      </div>
      {problem.message && !problem.field ? <p role="alert" className="rounded-md bg-danger-bg px-3 py-2 text-danger-ink">{problem.message}</p> : null}
      <Button type="submit" disabled={pending} className="w-full">{pending ? "Saving…" : "Save new password"}</Button>
    </form>
  );
}
