import Link from "next/link";
import { requirePageRole } from "@/lib/auth/page-guard";
import { AppShell } from "@/components/shell/app-shell";

export const metadata = { title: "Not available" };

export default async function NoAccess() {
  const user = await requirePageRole("any");
  return (
    <AppShell user={user}>
      <h1 className="text-2xl font-bold">Not available for your role</h1>
      <p className="mt-2 text-ink-soft">This page is not part of your work in Dentate. If you need it, ask an administrator.</p>
      <p className="mt-4"><Link className="font-semibold text-lagoon-700 underline" href="/">Go to your start page</Link></p>
    </AppShell>
  );
}
