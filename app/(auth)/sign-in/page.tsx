import type { Metadata } from "next";
import Link from "next/link";
import { redirect } from "next/navigation";
import { Wordmark } from "@/components/ui/wordmark";
import { getCurrentUser } from "@/lib/auth/guard";
import { servableRefusal } from "@/lib/auth/servable";
import { lifetimeNotice } from "@/lib/auth/session";
import { SignInForm } from "./sign-in-form";

export const metadata: Metadata = { title: "Sign in" };

export default async function SignInPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const refusal = await servableRefusal();
  if (refusal) {
    return (
      <main className="mx-auto flex min-h-screen max-w-xl flex-col justify-center px-6">
        <div role="alert" className="rounded-xl border-2 border-danger-rule bg-danger-bg p-8 text-danger-ink">
          <h1 className="mb-2"><Wordmark /></h1>
          <p className="font-bold">This server is not serving.</p>
          <p className="mt-2">{refusal}</p>
        </div>
      </main>
    );
  }
  if (await getCurrentUser()) redirect("/");
  const sp = await searchParams;
  const notice = sp.welcome ? "Your password is set. Sign in to start." : sp.reset ? "Your password was changed. Sign in with the new one." : sp.ended === "lifetime" ? lifetimeNotice() : null;
  return (
    <main className="mx-auto flex min-h-screen max-w-md flex-col justify-center px-6">
      <div className="rounded-xl border border-rule bg-panel p-8 shadow-sm">
        <h1 className="mb-1"><Wordmark /></h1>
        <p className="mb-6 text-ink-soft">Lesion maps and follow-up for the anal precancer clinic.</p>
        {notice ? <p role="status" className="mb-4 rounded-md bg-lagoon-50 px-3 py-2 text-lagoon-900">{notice}</p> : null}
        <SignInForm />
        <p className="mt-4 text-sm"><Link href="/forgot-password" className="font-semibold text-lagoon-700 underline">Forgot your password?</Link></p>
      </div>
    </main>
  );
}
