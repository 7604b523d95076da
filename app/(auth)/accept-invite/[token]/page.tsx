import type { Metadata } from "next";
import Link from "next/link";
import { Wordmark } from "@/components/ui/wordmark";
import { ROLE_LABEL } from "@/lib/domain/vocab";
import { peekInvitation } from "@/lib/server/accounts";
import { looksLikeToken } from "@/lib/accounts/tokens";
import { PASSWORD_MIN_CHARS } from "@/lib/accounts/password-rules";
import { AcceptInviteForm } from "./accept-invite-form";

export const metadata: Metadata = { title: "Set up your account", referrer: "no-referrer" };

// PUBLIC page: the token in the address is the only credential.
export default async function AcceptInvitePage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const invitation = looksLikeToken(token) ? await peekInvitation(token) : null;
  return (
    <main className="mx-auto flex min-h-screen max-w-md flex-col justify-center px-6">
      <div className="rounded-xl border border-rule bg-panel p-8 shadow-sm">
        <h1 className="mb-1"><Wordmark /></h1>
        {invitation ? (
          <>
            <p className="mb-6 text-ink-soft">
              Set up your account for <strong className="text-ink">{invitation.email}</strong> at {invitation.siteName}, as {ROLE_LABEL[invitation.role].toLowerCase()}.
            </p>
            <AcceptInviteForm token={token} minChars={PASSWORD_MIN_CHARS} />
          </>
        ) : (
          <>
            <p role="alert" className="mt-4 rounded-md bg-danger-bg px-3 py-2 text-danger-ink">This invitation link has expired, was already used or was withdrawn.</p>
            <p className="mt-4 text-ink-soft">Ask your administrator to send a new invitation. If you already set a password, <Link className="font-semibold text-lagoon-700 underline" href="/sign-in">sign in</Link>.</p>
          </>
        )}
      </div>
    </main>
  );
}
