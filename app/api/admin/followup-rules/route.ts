import { z } from "zod";
import { listSiteRules, updateSiteRules } from "@/lib/server/due-dates";
import { requireSite } from "@/lib/auth/guard";
import { siteRuleTableSchema } from "@/lib/due-dates/rules";
import { readJson, route } from "@/lib/http/route";

const putSchema = z.object({ siteId: z.string().uuid("Choose a site."), rules: siteRuleTableSchema });

export const GET = route({ roles: ["admin"] }, async ({ user }) => ({ sites: await listSiteRules(user.siteIds) }));

export const PUT = route({ roles: ["admin"] }, async ({ req, user, ip }) => {
  const body = await readJson(req, putSchema);
  requireSite(user, body.siteId);
  await updateSiteRules({ siteId: body.siteId, rules: body.rules, by: user.id, ip });
  return { ok: true };
});
