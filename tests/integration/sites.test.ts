// Sites and who works where: created and edited by administrators of those sites only, codes
// unique, every change audited with before and after; bad input is a 400 and writes nothing.
import { randomUUID } from "node:crypto";
import { and, eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { auditEvents, sites, userSites } from "@/db/schema";
import { GET as listSites, POST as createSite } from "@/app/api/admin/sites/route";
import { PATCH as editSite } from "@/app/api/admin/sites/[siteId]/route";
import { PUT as putUserSites } from "@/app/api/admin/users/[userId]/sites/route";
import { actor, ctx, makeSite, makeUser, req } from "../fixtures/factory";
import { tableChecksums } from "../support/db-checksum";

const tableChecksum = async (name: string) => (await tableChecksums())[name];

const code = () => `Q${randomUUID().replace(/-/g, "").slice(0, 6).toUpperCase()}`;
const siteBody = (c = code()) => ({ name: "Lakeside Anal Health Clinic", code: c, timeZone: "America/Chicago", postalCode: "60614" });

describe("sites", () => {
  it("an administrator creates a site, becomes its member, and the creation is audited", async () => {
    const home = await makeSite();
    const admin = await actor("admin", [home.id]);
    const body = siteBody();
    const res = await createSite(req("POST", "/api/admin/sites", admin, body), ctx({}));
    expect(res.status).toBe(201);
    const { site } = await res.json();
    expect(site).toMatchObject({ code: body.code, timeZone: "America/Chicago", postalCode: "60614", version: 1 });
    const [member] = await db.select().from(userSites).where(and(eq(userSites.userId, admin.userId), eq(userSites.siteId, site.id)));
    expect(member).toBeDefined();
    const [audit] = await db.select().from(auditEvents).where(and(eq(auditEvents.action, "site.create"), eq(auditEvents.entityId, site.id)));
    expect((audit!.detail as { after: { code: string } }).after.code).toBe(body.code);
  });

  it("refuses a taken code (409), an unknown time zone and a bad postal code (400), and writes nothing", async () => {
    const home = await makeSite();
    const admin = await actor("admin", [home.id]);
    const before = await tableChecksum("sites");
    const taken = await createSite(req("POST", "/api/admin/sites", admin, { ...siteBody(), code: "HBR" }), ctx({}));
    expect(taken.status).toBe(409);
    expect((await taken.json()).error.fields.code[0]).toMatch(/already uses/);
    const bad = await createSite(req("POST", "/api/admin/sites", admin, { ...siteBody(), timeZone: "Mars/Olympus", postalCode: "!!" }), ctx({}));
    expect(bad.status).toBe(400);
    const fields = (await bad.json()).error.fields;
    expect(Object.keys(fields)).toEqual(expect.arrayContaining(["timeZone", "postalCode"]));
    expect(await tableChecksum("sites")).toBe(before);
  });

  it("only administrators, and only of that site, edit it; a stale version is a 409; the edit is audited before and after", async () => {
    const site = await makeSite();
    const admin = await actor("admin", [site.id]);
    const otherAdmin = await actor("admin", [(await makeSite()).id]);
    const clinician = await actor("clinician", [site.id]);
    const url = `/api/admin/sites/${site.id}`;
    expect((await editSite(req("PATCH", url, clinician, { version: 1, name: "Renamed clinic" }), ctx({ siteId: site.id }))).status).toBe(403);
    expect((await editSite(req("PATCH", url, otherAdmin, { version: 1, name: "Renamed clinic" }), ctx({ siteId: site.id }))).status).toBe(404);
    const ok = await editSite(req("PATCH", url, admin, { version: 1, name: "Renamed clinic", timeZone: "Europe/London" }), ctx({ siteId: site.id }));
    expect(ok.status).toBe(200);
    expect((await ok.json()).site).toMatchObject({ name: "Renamed clinic", timeZone: "Europe/London", version: 2 });
    const stale = await editSite(req("PATCH", url, admin, { version: 1, name: "Another name" }), ctx({ siteId: site.id }));
    expect(stale.status).toBe(409);
    const [row] = await db.select({ name: sites.name }).from(sites).where(eq(sites.id, site.id));
    expect(row!.name).toBe("Renamed clinic");
    const [audit] = await db.select().from(auditEvents).where(and(eq(auditEvents.action, "site.update"), eq(auditEvents.entityId, site.id)));
    const detail = audit!.detail as { before: { name: string; timeZone: string }; after: { name: string; timeZone: string } };
    expect(detail.before).toMatchObject({ name: site.name, timeZone: "UTC" });
    expect(detail.after).toMatchObject({ name: "Renamed clinic", timeZone: "Europe/London" });
  });

  it("lists only the administrator's own sites", async () => {
    const mine = await makeSite();
    const theirs = await makeSite();
    const admin = await actor("admin", [mine.id]);
    const ids = (await (await listSites(req("GET", "/api/admin/sites", admin), ctx({}))).json()).sites.map((s: { id: string }) => s.id);
    expect(ids).toContain(mine.id);
    expect(ids).not.toContain(theirs.id);
  });
});

describe("who works where", () => {
  it("assigns and removes the administrator's sites, keeps the colleague's other sites, and audits both lists", async () => {
    const [a, b, elsewhere] = [await makeSite(), await makeSite(), await makeSite()];
    const admin = await actor("admin", [a.id, b.id]);
    const colleague = await makeUser("clinician", [a.id, elsewhere.id]);
    const url = `/api/admin/users/${colleague}/sites`;
    const res = await putUserSites(req("PUT", url, admin, { siteIds: [b.id] }), ctx({ userId: colleague }));
    expect(res.status).toBe(200);
    const now = (await db.select({ s: userSites.siteId }).from(userSites).where(eq(userSites.userId, colleague))).map((r) => r.s).sort();
    expect(now).toEqual([b.id, elsewhere.id].sort());
    const [audit] = await db.select().from(auditEvents).where(and(eq(auditEvents.action, "user.sites"), eq(auditEvents.entityId, colleague)));
    expect(audit!.detail).toEqual({ before: [a.id, elsewhere.id].sort(), after: [b.id, elsewhere.id].sort() });
  });

  it("refuses a site the administrator does not administer (400), a colleague of other sites only (404), and leaving no site (400)", async () => {
    const [a, other] = [await makeSite(), await makeSite()];
    const admin = await actor("admin", [a.id]);
    const colleague = await makeUser("reviewer", [a.id]);
    const stranger = await makeUser("reviewer", [other.id]);
    const before = await tableChecksum("user_sites");
    expect((await putUserSites(req("PUT", `/api/admin/users/${colleague}/sites`, admin, { siteIds: [other.id] }), ctx({ userId: colleague }))).status).toBe(400);
    expect((await putUserSites(req("PUT", `/api/admin/users/${stranger}/sites`, admin, { siteIds: [a.id] }), ctx({ userId: stranger }))).status).toBe(404);
    expect((await putUserSites(req("PUT", `/api/admin/users/${colleague}/sites`, admin, { siteIds: [] }), ctx({ userId: colleague }))).status).toBe(400);
    expect(await tableChecksum("user_sites")).toBe(before);
  });
});
