import { updateSite } from "@/lib/server/sites";
import { idParam, readJson, route } from "@/lib/http/route";
import { siteUpdateSchema } from "@/lib/validation/sites";

export const PATCH = route<{ siteId: string }>({ roles: ["admin"] }, async ({ req, user, params, ip }) => {
  const siteId = idParam(params.siteId);
  const input = await readJson(req, siteUpdateSchema);
  return { site: await updateSite(user, siteId, input, ip) };
});
