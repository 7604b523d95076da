import "server-only";
// Sites (clinics) and who works at which. Administrators manage the sites they work at; a new
// site's creator becomes its first member. Every change is audited with before and after.
import { db } from "@/db/client";
import { addUserSites, insertSiteWithMember, removeUserSites, siteCodeTaken, siteForUpdate, updateSiteRow, userSitesForUpdate } from "@/db/queries/sites";
import { recordAudit } from "@/db/queries/audit-write";
import { AppError } from "@/lib/errors";
import type { SiteInput, SiteUpdateInput } from "@/lib/validation/sites";

interface Admin {
  id: string;
  siteIds: string[];
}

const CODE_TAKEN = { code: ["Another site already uses this code."] };

export async function createSite(admin: Admin, input: SiteInput, ip: string) {
  return db.transaction(async (tx) => {
    if (await siteCodeTaken(tx, input.code)) throw new AppError("conflict", "Another site already uses this code.", CODE_TAKEN);
    const site = await insertSiteWithMember(tx, { code: input.code, name: input.name, timeZone: input.timeZone, postalCode: input.postalCode ?? null }, admin.id);
    await recordAudit({ userId: admin.id, siteId: site.id, action: "site.create", entityType: "site", entityId: site.id, ip, detail: { after: site } }, tx);
    return site;
  });
}

export async function updateSite(admin: Admin, siteId: string, input: SiteUpdateInput, ip: string) {
  if (!admin.siteIds.includes(siteId)) throw new AppError("not_found");
  return db.transaction(async (tx) => {
    const before = await siteForUpdate(tx, siteId);
    if (!before) throw new AppError("not_found");
    if (before.version !== input.version) throw new AppError("conflict", "Someone changed this site meanwhile: reload to see their change.");
    const { version, ...set } = input;
    if (set.code && set.code !== before.code && (await siteCodeTaken(tx, set.code, siteId))) throw new AppError("conflict", "Another site already uses this code.", CODE_TAKEN);
    const after = await updateSiteRow(tx, siteId, set, version + 1);
    await recordAudit({ userId: admin.id, siteId, action: "site.update", entityType: "site", entityId: siteId, ip, detail: { before, after } }, tx);
    return after;
  });
}

/**
 * Sets the sites a colleague works at, within the administrator's own sites: sites outside
 * them are kept as they are (another site's administrators decide those). The colleague must
 * work at one of the administrator's sites already, and keeps at least one site.
 */
export async function setUserSites(admin: Admin, userId: string, wanted: string[], ip: string) {
  const mine = new Set(admin.siteIds);
  return db.transaction(async (tx) => {
    const user = await userSitesForUpdate(tx, userId);
    if (!user || !user.siteIds.some((s) => mine.has(s))) throw new AppError("not_found");
    if (wanted.some((s) => !mine.has(s))) throw new AppError("invalid", undefined, { siteIds: ["You can only assign sites you administer."] });
    const keep = user.siteIds.filter((s) => !mine.has(s));
    const after = [...new Set([...keep, ...wanted])].sort();
    if (after.length === 0) throw new AppError("invalid", undefined, { siteIds: ["Everyone works at one site at least."] });
    await addUserSites(tx, userId, wanted.filter((s) => !user.siteIds.includes(s)));
    await removeUserSites(tx, userId, user.siteIds.filter((s) => mine.has(s) && !wanted.includes(s)));
    await recordAudit({ userId: admin.id, action: "user.sites", entityType: "user", entityId: userId, ip, detail: { before: [...user.siteIds].sort(), after } }, tx);
    return { id: userId, siteIds: after };
  });
}
