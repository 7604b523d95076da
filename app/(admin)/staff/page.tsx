import { AppShell } from "@/components/shell/app-shell";
import { ROLE_LABEL } from "@/components/shell/nav-links";
import { listStaff } from "@/db/queries/users";
import { requirePageRole } from "@/lib/auth/page-guard";

export const metadata = { title: "Staff" };

export default async function StaffPage() {
  const user = await requirePageRole(["admin"]);
  const rows = await listStaff(user.siteIds);
  return (
    <AppShell user={user}>
      <h1 className="text-2xl font-bold">Staff</h1>
      <p className="mt-1 text-sm text-ink-soft">Everyone with an account at your sites.</p>
      <table className="mt-4 w-full border-collapse rounded-lg bg-panel text-left">
        <thead className="border-b border-rule bg-lagoon-50 text-sm">
          <tr><th className="px-3 py-2">Name</th><th className="px-3 py-2">E-mail</th><th className="px-3 py-2">Role</th><th className="px-3 py-2">Account</th></tr>
        </thead>
        <tbody>
          {rows.map((s) => (
            <tr key={s.id} className="border-b border-rule last:border-0">
              <td className="px-3 py-2 font-semibold">{s.displayName}</td>
              <td className="px-3 py-2">{s.email}</td>
              <td className="px-3 py-2">{ROLE_LABEL[s.role]}</td>
              <td className="px-3 py-2">{s.active ? "Active" : "Deactivated"}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </AppShell>
  );
}
