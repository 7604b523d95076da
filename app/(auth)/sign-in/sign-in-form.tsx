"use client";

import { useActionState } from "react";
import { Button } from "@/components/ui/button";
import { signInAction, type SignInState } from "./actions";

export function SignInForm() {
  const [state, action, pending] = useActionState<SignInState, FormData>(signInAction, {});
  return (
    <form action={action} className="space-y-4" noValidate>
      <div>
        <label htmlFor="email" className="block font-semibold">E-mail</label>
        <input id="email" name="email" type="email" autoComplete="username" defaultValue={state.email} required
          aria-invalid={!!state.fields?.email} aria-describedby={state.fields?.email ? "email-error" : undefined}
          className="mt-1 min-h-11 w-full rounded-md border border-rule-strong bg-panel px-3" />
        {state.fields?.email ? <p id="email-error" className="mt-1 text-sm text-danger-ink">{state.fields.email[0]}</p> : null}
      </div>
      <div>
        <label htmlFor="password" className="block font-semibold">Password</label>
        <input id="password" name="password" type="password" autoComplete="current-password" required
          aria-invalid={!!state.fields?.password} aria-describedby={state.fields?.password ? "password-error" : undefined}
          className="mt-1 min-h-11 w-full rounded-md border border-rule-strong bg-panel px-3" />
        {state.fields?.password ? <p id="password-error" className="mt-1 text-sm text-danger-ink">{state.fields.password[0]}</p> : null}
      </div>
      {state.message ? <p role="alert" className="rounded-md bg-danger-bg px-3 py-2 text-danger-ink">{state.message}</p> : null}
      <Button type="submit" disabled={pending} className="w-full">{pending ? "Signing in…" : "Sign in"}</Button>
    </form>
  );
}
