"use client";

import { useState } from "react";
import { useRouter } from "next/navigation";
import { Button } from "@/components/ui/button";

interface Option { value: string; label: string }

async function send(method: string, url: string, body?: unknown): Promise<{ ok: boolean; message?: string; fields?: Record<string, string[]> }> {
  const res = await fetch(url, { method, headers: body ? { "content-type": "application/json" } : undefined, body: body ? JSON.stringify(body) : undefined }).catch(() => null);
  if (res?.ok) return { ok: true };
  const data = res ? await res.json().catch(() => null) : null;
  return { ok: false, message: data?.error?.message ?? "The service is briefly unavailable. Try again in a moment.", fields: data?.error?.fields };
}

function useAction() {
  const router = useRouter();
  const [pending, setPending] = useState(false);
  const [error, setError] = useState<string | null>(null);
  async function run(method: string, url: string, body?: unknown) {
    setPending(true);
    setError(null);
    const r = await send(method, url, body);
    setPending(false);
    if (!r.ok) setError(Object.values(r.fields ?? {})[0]?.[0] ?? r.message ?? null);
    else router.refresh();
    return r;
  }
  return { pending, error, run };
}

export function StaffRowActions({ userId, name, role, active, self, roles }: { userId: string; name: string; role: string; active: boolean; self: boolean; roles: Option[] }) {
  const { pending, error, run } = useAction();
  const url = `/api/admin/users/${encodeURIComponent(userId)}`;
  return (
    <>
      <td className="px-3 py-2">
        <label className="sr-only" htmlFor={`role-${userId}`}>Role of {name}</label>
        <select id={`role-${userId}`} defaultValue={role} disabled={self || pending} onChange={(e) => run("PATCH", url, { role: e.target.value })}
          className="min-h-11 rounded-md border border-rule-strong bg-panel px-2">
          {roles.map((r) => <option key={r.value} value={r.value}>{r.label}</option>)}
        </select>
      </td>
      <td className="px-3 py-2">
        <span className="mr-3">{active ? "Active" : "Deactivated"}</span>
        {self ? <span className="text-sm text-ink-soft">(you)</span> : (
          <Button variant={active ? "secondary" : "ghost"} disabled={pending} aria-label={`${active ? "Deactivate" : "Reactivate"} ${name}`} onClick={() => run("PATCH", url, { active: !active })}>
            {active ? "Deactivate" : "Reactivate"}
          </Button>
        )}
        {error ? <p role="alert" className="mt-1 text-sm text-danger-ink">{error}</p> : null}
      </td>
    </>
  );
}

export function InviteForm({ sites, roles }: { sites: Option[]; roles: Option[] }) {
  const { pending, error, run } = useAction();
  const [sentTo, setSentTo] = useState<string | null>(null);
  async function submit(form: FormData) {
    setSentTo(null);
    const email = String(form.get("email") ?? "");
    const r = await run("POST", "/api/admin/invitations", { email, siteId: form.get("siteId"), role: form.get("role") });
    if (r.ok) setSentTo(email);
  }
  return (
    <form onSubmit={(e) => { e.preventDefault(); void submit(new FormData(e.currentTarget)); }} className="mt-3 flex flex-wrap items-end gap-3 rounded-lg border border-rule bg-panel p-4" noValidate>
      <div>
        <label htmlFor="invite-email" className="block font-semibold">E-mail</label>
        <input id="invite-email" name="email" type="email" required className="mt-1 min-h-11 w-72 rounded-md border border-rule-strong bg-panel px-3" />
      </div>
      <div>
        <label htmlFor="invite-site" className="block font-semibold">Site</label>
        <select id="invite-site" name="siteId" className="mt-1 min-h-11 rounded-md border border-rule-strong bg-panel px-2">
          {sites.map((s) => <option key={s.value} value={s.value}>{s.label}</option>)}
        </select>
      </div>
      <div>
        <label htmlFor="invite-role" className="block font-semibold">Role</label>
        <select id="invite-role" name="role" defaultValue="clinician" className="mt-1 min-h-11 rounded-md border border-rule-strong bg-panel px-2">
          {roles.map((r) => <option key={r.value} value={r.value}>{r.label}</option>)}
        </select>
      </div>
      <Button type="submit" disabled={pending}>{pending ? "Sending…" : "Send invitation"}</Button>
      {error ? <p role="alert" className="w-full text-sm text-danger-ink">{error}</p> : null}
      {sentTo ? <p role="status" className="w-full text-sm text-ok-ink">Invitation sent to {sentTo}.</p> : null}
    </form>
  );
}

const STATE_LABEL = { open: "Waiting", accepted: "Accepted", revoked: "Withdrawn", expired: "Expired" } as const;

export function InvitationRow(p: { id: string; email: string; siteName: string; roleLabel: string; state: keyof typeof STATE_LABEL; expiresOn: string }) {
  const { pending, error, run } = useAction();
  const base = `/api/admin/invitations/${p.id}`;
  const canAct = p.state === "open" || p.state === "expired";
  return (
    <tr className="border-b border-rule last:border-0">
      <td className="px-3 py-2">{p.email}</td>
      <td className="px-3 py-2">{p.siteName}</td>
      <td className="px-3 py-2">{p.roleLabel}</td>
      <td className="px-3 py-2">{STATE_LABEL[p.state]}{p.state === "open" ? <span className="text-sm text-ink-soft"> · until {p.expiresOn}</span> : null}</td>
      <td className="px-3 py-2">
        {canAct ? (
          <div className="flex gap-2">
            <Button variant="secondary" disabled={pending} onClick={() => run("POST", `${base}/resend`)}>Send again</Button>
            <Button variant="ghost" disabled={pending} onClick={() => run("DELETE", base)}>Withdraw</Button>
          </div>
        ) : null}
        {error ? <p role="alert" className="mt-1 text-sm text-danger-ink">{error}</p> : null}
      </td>
    </tr>
  );
}

/** The sites a colleague works at, among yours (sites you do not administer are kept as they are). */
export function StaffSites({ userId, name, current, sites }: { userId: string; name: string; current: string[]; sites: Option[] }) {
  const { pending, error, run } = useAction();
  const [chosen, setChosen] = useState(() => new Set(current.filter((s) => sites.some((o) => o.value === s))));
  const toggle = (id: string) => {
    const next = new Set(chosen);
    if (next.has(id)) next.delete(id);
    else next.add(id);
    setChosen(next);
  };
  return (
    <fieldset className="flex flex-wrap items-center gap-3">
      <legend className="sr-only">Sites of {name}</legend>
      {sites.map((s) => (
        <label key={s.value} className="inline-flex min-h-11 items-center gap-2">
          <input type="checkbox" className="h-5 w-5" checked={chosen.has(s.value)} disabled={pending} onChange={() => toggle(s.value)} />
          {s.label}
        </label>
      ))}
      <Button variant="secondary" disabled={pending} aria-label={`Save sites of ${name}`} onClick={() => run("PUT", `/api/admin/users/${encodeURIComponent(userId)}/sites`, { siteIds: [...chosen] })}>Save sites</Button>
      {error ? <p role="alert" className="w-full text-sm text-danger-ink">{error}</p> : null}
    </fieldset>
  );
}
