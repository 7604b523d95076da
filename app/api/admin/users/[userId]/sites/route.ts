import { z } from "zod";
import { setUserSites } from "@/lib/server/sites";
import { AppError } from "@/lib/errors";
import { readJson, route } from "@/lib/http/route";
import { userSitesSchema } from "@/lib/validation/sites";

const userIdParam = z.string().min(1).max(100);

/** The sites a colleague works at, among the administrator's own. */
export const PUT = route<{ userId: string }>({ roles: ["admin"] }, async ({ req, user, params, ip }) => {
  const id = userIdParam.safeParse(params.userId);
  if (!id.success) throw new AppError("not_found");
  const { siteIds } = await readJson(req, userSitesSchema);
  return setUserSites(user, id.data, siteIds, ip);
});
