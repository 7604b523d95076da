import Link from "next/link";
import type { ReactNode } from "react";
import { Wordmark } from "@/components/ui/wordmark";
import { signOutAction } from "@/lib/auth/sign-out-action";
import type { CurrentUser } from "@/lib/auth/guard";
import { navLinksFor } from "./nav-links";
import { ROLE_LABEL } from "@/lib/domain/vocab";

export function AppShell({ user, children }: { user: CurrentUser; children: ReactNode }) {
  return (
    <div className="min-h-screen">
      <header className="no-print border-b border-rule bg-panel">
        <div className="mx-auto flex max-w-7xl flex-wrap items-center gap-6 px-4 py-2">
          <Link href="/" aria-label="Dentate home"><Wordmark /></Link>
          <nav aria-label="Main" className="flex gap-1">
            {navLinksFor(user.role).map((l) => (
              <Link key={l.href} href={l.href} className="inline-flex min-h-11 items-center rounded-md px-3 font-semibold text-ink hover:bg-lagoon-50">
                {l.label}
              </Link>
            ))}
          </nav>
          <div className="ml-auto flex items-center gap-3 text-sm">
            <span>
              <span className="font-semibold">{user.displayName}</span>
              <span className="text-ink-soft"> · {ROLE_LABEL[user.role]}</span>
            </span>
            <form action={signOutAction}>
              <button type="submit" className="min-h-11 rounded-md border border-rule-strong px-3 font-semibold hover:bg-lagoon-50">Sign out</button>
            </form>
          </div>
        </div>
      </header>
      <main className="mx-auto max-w-7xl px-4 py-6">{children}</main>
    </div>
  );
}
