import type { Metadata } from "next";
import { Wordmark } from "@/components/ui/wordmark";
import { PASSWORD_MIN_CHARS } from "@/lib/accounts/password-rules";
import { ResetPasswordForm } from "./reset-password-form";

export const metadata: Metadata = { title: "Choose a new password", referrer: "no-referrer" };

// PUBLIC page. The token is checked when the form is sent, so the page says nothing about it.
export default async function ResetPasswordPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  return (
    <main className="mx-auto flex min-h-screen max-w-md flex-col justify-center px-6">
      <div className="rounded-xl border border-rule bg-panel p-8 shadow-sm">
        <h1 className="mb-1"><Wordmark /></h1>
        <p className="mb-6 text-ink-soft">Choose a new password. Every device signed in to this account will be signed out.</p>
        <ResetPasswordForm token={token} minChars={PASSWORD_MIN_CHARS} />
      </div>
    </main>
  );
}
