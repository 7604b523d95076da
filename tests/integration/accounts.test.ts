import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { randomUUID } from "node:crypto";
import { eq, inArray } from "drizzle-orm";
import { db } from "@/db/client";
import { auditEvents, invitations, users } from "@/db/schema";
import { deliverPending } from "@/lib/server/outbox";
import { signIn } from "@/lib/auth/sign-in";
import { validateSession } from "@/lib/auth/session";
import { INVITATION_TTL_MS } from "@/lib/accounts/tokens";
import { inviteUser } from "@/lib/server/accounts";
import { POST as invitePost } from "@/app/api/admin/invitations/route";
import { DELETE as revokeDelete } from "@/app/api/admin/invitations/[invitationId]/route";
import { POST as resendPost } from "@/app/api/admin/invitations/[invitationId]/resend/route";
import { PATCH as userPatch } from "@/app/api/admin/users/[userId]/route";
import { POST as acceptPost } from "@/app/api/auth/accept-invite/route";
import { POST as forgotPost } from "@/app/api/auth/forgot-password/route";
import { POST as resetPost } from "@/app/api/auth/reset-password/route";
import { actor, ctx, makeSite, req } from "../fixtures/factory";
import { linkIn, MaildevFake } from "./maildev-fake";

const fake = new MaildevFake();
beforeAll(() => fake.start());
afterAll(() => fake.stop());

const GOOD_PASSWORD = "violet tramline orchard";
const tokenOf = (link: string) => link.split("/").pop()!;
// Each public call comes from its own address so the per-address limit does not interfere.
const from = () => ({ "x-dentate-peer": `10.77.${Math.floor(Math.random() * 250)}.${Math.floor(Math.random() * 250)}` });

async function invitedMail(email: string) {
  await deliverPending();
  const mails = await fake.mailsTo(email);
  expect(mails.length).toBeGreaterThan(0);
  return mails[mails.length - 1]!;
}

describe("accounts by e-mail invitation", () => {
  it("an invitation arrives in the fake inbox; its link sets a password once and fails the second time", async () => {
    const site = await makeSite();
    const admin = await actor("admin", [site.id]);
    const email = `new-${randomUUID()}@test.example`;
    const res = await invitePost(req("POST", "/api/admin/invitations", admin, { email, siteId: site.id, role: "clinician" }));
    expect(res.status).toBe(200);
    const mail = await invitedMail(email);
    expect(mail.subject).toMatch(/account/i);
    const token = tokenOf(linkIn(mail.text, "/accept-invite/"));

    const first = await acceptPost(req("POST", "/api/auth/accept-invite", null, { token, displayName: "Dr New Person", password: GOOD_PASSWORD }, from()));
    expect(first.status).toBe(200);
    const session = await signIn(email, GOOD_PASSWORD, "10.0.0.9");
    expect(session.role).toBe("clinician");

    const second = await acceptPost(req("POST", "/api/auth/accept-invite", null, { token, displayName: "Someone Else", password: "another long passphrase" }, from()));
    expect(second.status).toBe(400);
    expect((await second.json()).error.fields.token[0]).toMatch(/expired or was already used/);
    const [u] = await db.select({ name: users.displayName }).from(users).where(eq(users.email, email));
    expect(u!.name).toBe("Dr New Person");
  });

  it("an invitation link fails after 72 hours", async () => {
    const site = await makeSite();
    const admin = await actor("admin", [site.id]);
    const email = `late-${randomUUID()}@test.example`;
    // Issued 73 hours ago, so it expired an hour ago.
    await inviteUser({ email, siteId: site.id, role: "reviewer", invitedBy: admin.userId, ip: "t", now: new Date(Date.now() - INVITATION_TTL_MS - 3_600_000) });
    const token = tokenOf(linkIn((await invitedMail(email)).text, "/accept-invite/"));
    const res = await acceptPost(req("POST", "/api/auth/accept-invite", null, { token, displayName: "Late Person", password: GOOD_PASSWORD }, from()));
    expect(res.status).toBe(400);
    expect(await db.select().from(users).where(eq(users.email, email))).toHaveLength(0);
  });

  it("refuses a short or common password and leaves the invitation usable", async () => {
    const site = await makeSite();
    const admin = await actor("admin", [site.id]);
    const email = `weak-${randomUUID()}@test.example`;
    await invitePost(req("POST", "/api/admin/invitations", admin, { email, siteId: site.id, role: "clinician" }));
    const token = tokenOf(linkIn((await invitedMail(email)).text, "/accept-invite/"));
    const short = await acceptPost(req("POST", "/api/auth/accept-invite", null, { token, displayName: "Weak Person", password: "short pass" }, from()));
    expect(short.status).toBe(400);
    expect((await short.json()).error.fields.password).toBeDefined();
    const ok = await acceptPost(req("POST", "/api/auth/accept-invite", null, { token, displayName: "Weak Person", password: GOOD_PASSWORD }, from()));
    expect(ok.status).toBe(200);
  });

  it("re-sending replaces the link; revoking kills it; another site's invitation is not found", async () => {
    const site = await makeSite();
    const other = await makeSite();
    const admin = await actor("admin", [site.id]);
    const outsider = await actor("admin", [other.id]);
    const email = `resend-${randomUUID()}@test.example`;
    const { id } = await (await invitePost(req("POST", "/api/admin/invitations", admin, { email, siteId: site.id, role: "clinician" }))).json();
    const oldToken = tokenOf(linkIn((await invitedMail(email)).text, "/accept-invite/"));
    expect((await resendPost(req("POST", `/api/admin/invitations/${id}/resend`, admin), ctx({ invitationId: id }))).status).toBe(200);
    const newToken = tokenOf(linkIn((await invitedMail(email)).text, "/accept-invite/"));
    expect(newToken).not.toBe(oldToken);
    expect((await acceptPost(req("POST", "/api/auth/accept-invite", null, { token: oldToken, displayName: "X Person", password: GOOD_PASSWORD }, from()))).status).toBe(400);
    expect((await revokeDelete(req("DELETE", `/api/admin/invitations/${id}`, outsider), ctx({ invitationId: id }))).status).toBe(404);
    expect((await revokeDelete(req("DELETE", `/api/admin/invitations/${id}`, admin), ctx({ invitationId: id }))).status).toBe(200);
    expect((await acceptPost(req("POST", "/api/auth/accept-invite", null, { token: newToken, displayName: "X Person", password: GOOD_PASSWORD }, from()))).status).toBe(400);
    const [inv] = await db.select().from(invitations).where(eq(invitations.id, id));
    expect(inv!.revokedAt).not.toBeNull();
  });

  it("only admins invite, and bad input is a 400 that writes nothing", async () => {
    const site = await makeSite();
    const clinician = await actor("clinician", [site.id]);
    const admin = await actor("admin", [site.id]);
    expect((await invitePost(req("POST", "/api/admin/invitations", clinician, { email: "x@test.example", siteId: site.id, role: "clinician" }))).status).toBe(403);
    const bad = await invitePost(req("POST", "/api/admin/invitations", admin, { email: "not-an-address", siteId: site.id, role: "wizard" }));
    expect(bad.status).toBe(400);
    expect(Object.keys((await bad.json()).error.fields).sort()).toEqual(["email", "role"]);
  });
});

describe("password reset", () => {
  async function knownAccount() {
    const site = await makeSite();
    const admin = await actor("admin", [site.id]);
    const email = `known-${randomUUID()}@test.example`;
    await invitePost(req("POST", "/api/admin/invitations", admin, { email, siteId: site.id, role: "clinician" }));
    const token = tokenOf(linkIn((await invitedMail(email)).text, "/accept-invite/"));
    await acceptPost(req("POST", "/api/auth/accept-invite", null, { token, displayName: "Known Person", password: GOOD_PASSWORD }, from()));
    return email;
  }

  it("answers an unknown address exactly as a known one: same status, same body, similar time", async () => {
    const known = await knownAccount();
    const unknown = `nobody-${randomUUID()}@test.example`;
    const timed = async (email: string) => {
      const t0 = performance.now();
      const res = await forgotPost(req("POST", "/api/auth/forgot-password", null, { email }, from()));
      return { status: res.status, body: await res.text(), ms: performance.now() - t0 };
    };
    const a = await timed(known);
    const b = await timed(unknown);
    expect(b.status).toBe(a.status);
    expect(b.body).toBe(a.body);
    expect(Math.abs(a.ms - b.ms)).toBeLessThan(250);
    await deliverPending();
    expect((await fake.mailsTo(known)).filter((m) => /reset/i.test(m.subject))).toHaveLength(1);
    expect(await fake.mailsTo(unknown)).toHaveLength(0);
  });

  it("the reset link sets a new password once, ends the old sessions, and fails the second time", async () => {
    const email = await knownAccount();
    const before = await signIn(email, GOOD_PASSWORD, "10.0.0.8");
    await forgotPost(req("POST", "/api/auth/forgot-password", null, { email }, from()));
    await deliverPending();
    const mail = (await fake.mailsTo(email)).find((m) => /reset/i.test(m.subject))!;
    const token = tokenOf(linkIn(mail.text, "/reset-password/"));
    expect((await resetPost(req("POST", "/api/auth/reset-password", null, { token, password: "granite pelican evening" }, from()))).status).toBe(200);
    expect(await validateSession(before.sessionId)).toBeNull();
    expect((await signIn(email, "granite pelican evening", "10.0.0.8")).sessionId).toBeTruthy();
    expect((await resetPost(req("POST", "/api/auth/reset-password", null, { token, password: "another river stone" }, from()))).status).toBe(400);
  });

  it("public routes refuse a request from another origin", async () => {
    const res = await forgotPost(req("POST", "/api/auth/forgot-password", null, { email: "x@test.example" }, { origin: "http://evil.example", ...from() }));
    expect(res.status).toBe(403);
  });
});

describe("account administration", () => {
  it("deactivating ends the user's sessions at once; role changes are audited with before and after", async () => {
    const site = await makeSite();
    const admin = await actor("admin", [site.id]);
    const target = await actor("clinician", [site.id]);
    const sessionId = target.cookie.split("=")[1]!;
    expect(await validateSession(sessionId)).not.toBeNull();
    expect((await userPatch(req("PATCH", `/api/admin/users/${target.userId}`, admin, { role: "reviewer" }), ctx({ userId: target.userId }))).status).toBe(200);
    expect((await userPatch(req("PATCH", `/api/admin/users/${target.userId}`, admin, { active: false }), ctx({ userId: target.userId }))).status).toBe(200);
    expect(await validateSession(sessionId)).toBeNull();
    const events = await db.select().from(auditEvents).where(eq(auditEvents.entityId, target.userId));
    expect(events.map((e) => e.action).sort()).toEqual(["user.deactivated", "user.updated"]);
    expect(events.find((e) => e.action === "user.updated")!.detail).toMatchObject({ before: { role: "clinician" }, after: { role: "reviewer" } });
  });

  it("a site's only admin cannot deactivate themself, nor touch a user of another site", async () => {
    const site = await makeSite();
    const admin = await actor("admin", [site.id]);
    const stranger = await actor("clinician", [(await makeSite()).id]);
    expect((await userPatch(req("PATCH", `/api/admin/users/${admin.userId}`, admin, { active: false }), ctx({ userId: admin.userId }))).status).toBe(409);
    expect((await userPatch(req("PATCH", `/api/admin/users/${stranger.userId}`, admin, { active: false }), ctx({ userId: stranger.userId }))).status).toBe(404);
  });
});

describe("administrators across sites", () => {
  const patch = (by: Awaited<ReturnType<typeof actor>>, userId: string, body: object) => userPatch(req("PATCH", `/api/admin/users/${userId}`, by, body), ctx({ userId }));

  it("an administrator of one site cannot change the role or active flag of someone who also works at another site", async () => {
    const north = await makeSite("North");
    const south = await makeSite("South");
    const northAdmin = await actor("admin", [north.id]);
    const both = await actor("clinician", [north.id, south.id]);
    for (const body of [{ role: "reviewer" }, { active: false }]) {
      const res = await patch(northAdmin, both.userId, body);
      expect(res.status).toBe(403);
      expect((await res.json()).error.message).toContain(south.name);
    }
    const [row] = await db.select({ role: users.role, active: users.active }).from(users).where(eq(users.id, both.userId));
    expect(row).toEqual({ role: "clinician", active: true });
    // An administrator of both sites may.
    const bothAdmin = await actor("admin", [north.id, south.id]);
    expect((await patch(bothAdmin, both.userId, { role: "reviewer" })).status).toBe(200);
  });

  it("an administrator may step down while another active administrator remains at each of their sites, never leaving a site without one (409)", async () => {
    const north = await makeSite("North");
    const south = await makeSite("South");
    const a = await actor("admin", [north.id]);
    const b = await actor("admin", [north.id]);
    expect((await patch(a, a.userId, { role: "clinician" })).status).toBe(200);
    for (const body of [{ role: "clinician" }, { active: false }]) {
      const res = await patch(b, b.userId, body);
      expect(res.status).toBe(409);
      expect((await res.json()).error.message).toContain(north.name);
    }
    // Over two sites: North has b and c, South only c.
    const c = await actor("admin", [north.id, south.id]);
    expect((await patch(b, c.userId, { active: false })).status).toBe(403);
    const res = await patch(c, c.userId, { active: false });
    expect(res.status).toBe(409);
    const message = (await res.json()).error.message as string;
    expect(message).toContain(south.name);
    expect(message).not.toContain(north.name);
    const rows = await db.select({ id: users.id, role: users.role, active: users.active }).from(users).where(inArray(users.id, [b.userId, c.userId]));
    expect(rows.every((r) => r.role === "admin" && r.active)).toBe(true);
  });
});
