import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { Wordmark } from "@/components/ui/wordmark";
import { getCurrentUser } from "@/lib/auth/guard";
import { SignInForm } from "./sign-in-form";

export const metadata: Metadata = { title: "Sign in" };

export default async function SignInPage() {
  if (await getCurrentUser()) redirect("/");
  return (
    <main className="mx-auto flex min-h-screen max-w-md flex-col justify-center px-6">
      <div className="rounded-xl border border-rule bg-panel p-8 shadow-sm">
        <h1 className="mb-1"><Wordmark /></h1>
        <p className="mb-6 text-ink-soft">Lesion maps and follow-up for the anal precancer clinic.</p>
        <SignInForm />
      </div>
    </main>
  );
}
