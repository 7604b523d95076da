import type { Metadata } from "next";
import Link from "next/link";
import { Wordmark } from "@/components/ui/wordmark";
import { ForgotPasswordForm } from "./forgot-password-form";

export const metadata: Metadata = { title: "Forgot password" };

// PUBLIC page.
export default function ForgotPasswordPage() {
  return (
    <main className="mx-auto flex min-h-screen max-w-md flex-col justify-center px-6">
      <div className="rounded-xl border border-rule bg-panel p-8 shadow-sm">
        <h1 className="mb-1"><Wordmark /></h1>
        <p className="mb-6 text-ink-soft">Enter the e-mail address of your account. We send a link to choose a new password.</p>
        <ForgotPasswordForm />
        <p className="mt-6 text-sm"><Link className="font-semibold text-lagoon-700 underline" href="/sign-in">Back to sign in</Link></p>
      </div>
    </main>
  );
}
