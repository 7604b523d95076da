import { listSitesByIds } from "@/db/queries/sites";
import { createSite } from "@/lib/server/sites";
import { json, readJson, route } from "@/lib/http/route";
import { siteSchema } from "@/lib/validation/sites";

export const GET = route({ roles: ["admin"] }, async ({ user }) => ({ sites: await listSitesByIds(user.siteIds) }));

export const POST = route({ roles: ["admin"] }, async ({ req, user, ip }) => {
  const input = await readJson(req, siteSchema);
  return json({ site: await createSite(user, input, ip) }, 201);
});
