import { AppShell } from "@/components/shell/app-shell";
import { ROLE_LABEL } from "@/lib/domain/vocab";
import { listInvitations } from "@/db/queries/accounts";
import { listSiteRules } from "@/lib/server/due-dates";
import { listStaff } from "@/db/queries/users";
import { requirePageRole } from "@/lib/auth/page-guard";
import { ROLES } from "@/lib/domain/vocab";
import { InvitationRow, InviteForm, StaffRowActions, StaffSites } from "./staff-actions";

export const metadata = { title: "Staff" };

function invitationState(i: { usedAt: Date | null; revokedAt: Date | null; expiresAt: Date }, now: Date): "accepted" | "revoked" | "expired" | "open" {
  if (i.usedAt) return "accepted";
  if (i.revokedAt) return "revoked";
  return i.expiresAt <= now ? "expired" : "open";
}

export default async function StaffPage() {
  const user = await requirePageRole(["admin"]);
  const [rows, invitations, sites] = await Promise.all([listStaff(user.siteIds), listInvitations(user.siteIds), listSiteRules(user.siteIds)]);
  const now = new Date();
  const roles = ROLES.map((r) => ({ value: r, label: ROLE_LABEL[r] }));
  const siteOptions = sites.map((s) => ({ value: s.id, label: s.code }));
  return (
    <AppShell user={user}>
      <h1 className="text-2xl font-bold">Staff</h1>
      <p className="mt-1 text-sm text-ink-soft">Everyone with an account at your sites. Deactivating an account signs it out everywhere at once.</p>
      <table className="mt-4 w-full border-collapse rounded-lg bg-panel text-left">
        <thead className="border-b border-rule bg-lagoon-50 text-sm">
          <tr><th className="px-3 py-2">Name</th><th className="px-3 py-2">E-mail</th><th className="px-3 py-2">Role</th><th className="px-3 py-2">Account</th><th className="px-3 py-2">Sites</th></tr>
        </thead>
        <tbody>
          {rows.map((s) => (
            <tr key={s.id} className="border-b border-rule last:border-0">
              <td className="px-3 py-2 font-semibold">{s.displayName}</td>
              <td className="px-3 py-2">{s.email}</td>
              <StaffRowActions userId={s.id} name={s.displayName} role={s.role} active={s.active} self={s.id === user.id} roles={roles} />
              <td className="px-3 py-2"><StaffSites userId={s.id} name={s.displayName} current={s.siteIds} sites={siteOptions} /></td>
            </tr>
          ))}
        </tbody>
      </table>

      <h2 className="mt-10 text-xl font-bold">Invite someone</h2>
      <p className="mt-1 text-sm text-ink-soft">They receive an e-mail with a link to choose a password. The link works once, for 72 hours.</p>
      <InviteForm sites={sites.map((s) => ({ value: s.id, label: s.name }))} roles={roles} />

      <h2 className="mt-10 text-xl font-bold">Invitations</h2>
      <table className="mt-3 w-full border-collapse rounded-lg bg-panel text-left">
        <thead className="border-b border-rule bg-lagoon-50 text-sm">
          <tr><th className="px-3 py-2">E-mail</th><th className="px-3 py-2">Site</th><th className="px-3 py-2">Role</th><th className="px-3 py-2">State</th><th className="px-3 py-2"><span className="sr-only">Actions</span></th></tr>
        </thead>
        <tbody>
          {invitations.map((i) => (
            <InvitationRow key={i.id} id={i.id} email={i.email} siteName={i.siteName} roleLabel={ROLE_LABEL[i.role]} state={invitationState(i, now)} expiresOn={i.expiresAt.toISOString().slice(0, 10)} />
          ))}
          {invitations.length === 0 ? <tr><td colSpan={5} className="px-3 py-6 text-center text-ink-soft">No invitations yet.</td></tr> : null}
        </tbody>
      </table>
    </AppShell>
  );
}
