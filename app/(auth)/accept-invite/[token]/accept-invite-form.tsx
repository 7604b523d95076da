"use client";

import { useState } from "react";
import { useRouter } from "next/navigation";
import { Button } from "@/components/ui/button";

interface Problems { message?: string; fields?: Record<string, string[]> }

export function AcceptInviteForm({ token, minChars }: { token: string; minChars: number }) {
  const router = useRouter();
  const [pending, setPending] = useState(false);
  const [problems, setProblems] = useState<Problems>({});

  async function submit(form: FormData) {
    setPending(true);
    setProblems({});
    const res = await fetch("/api/auth/accept-invite", {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify({ token, displayName: form.get("displayName"), password: form.get("password") }),
    }).catch(() => null);
    if (res?.ok) {
      router.push("/sign-in?welcome=1");
      return;
    }
    const body = res ? await res.json().catch(() => null) : null;
    setProblems({ message: body?.error?.message ?? "The service is briefly unavailable. Try again in a moment.", fields: body?.error?.fields });
    setPending(false);
  }

  const f = problems.fields ?? {};
  return (
    <form onSubmit={(e) => { e.preventDefault(); void submit(new FormData(e.currentTarget)); }} className="space-y-4" noValidate>
      <div>
        <label htmlFor="displayName" className="block font-semibold">Your name</label>
        <input id="displayName" name="displayName" autoComplete="name" required aria-invalid={!!f.displayName}
          className="mt-1 min-h-11 w-full rounded-md border border-rule-strong bg-panel px-3" />
        {f.displayName ? <p className="mt-1 text-sm text-danger-ink">{f.displayName[0]}</p> : null}
      </div>
      <div>
        <label htmlFor="password" className="block font-semibold">New password</label>
        <input id="password" name="password" type="password" autoComplete="new-password" required aria-invalid={!!f.password} aria-describedby={f.password ? "password-hint password-error" : "password-hint"}
          className="mt-1 min-h-11 w-full rounded-md border border-rule-strong bg-panel px-3" />
        <p id="password-hint" className="mt-1 text-sm text-ink-soft">At least {minChars} characters. Any characters, spaces too; a few unrelated words work well.</p>
        {f.password ? <p id="password-error" className="mt-1 text-sm text-danger-ink">{f.password[0]}</p> : null}
      </div>
      {problems.message && !f.password && !f.displayName ? <p role="alert" className="rounded-md bg-danger-bg px-3 py-2 text-danger-ink">{f.token?.[0] ?? problems.message}</p> : null}
      <Button type="submit" disabled={pending} className="w-full">{pending ? "Saving…" : "Set password"}</Button>
    </form>
  );
}
