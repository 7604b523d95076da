import { z } from "zod";
import { updateUser } from "@/lib/server/accounts";
import { updateUserSchema } from "@/lib/accounts/schemas";
import { invalidateUserSessions } from "@/lib/auth/session";
import { AppError } from "@/lib/errors";
import { readJson, route } from "@/lib/http/route";

const userIdParam = z.string().min(1).max(100);

export const PATCH = route<{ userId: string }>({ roles: ["admin"] }, async ({ req, user, params, ip }) => {
  const id = userIdParam.safeParse(params.userId);
  if (!id.success) throw new AppError("not_found");
  const body = await readJson(req, updateUserSchema);
  const result = await updateUser({ userId: id.data, adminId: user.id, adminSiteIds: user.siteIds, ...body, ip });
  // Deactivation ends every session at once, not at the next expiry.
  if (!result.active) await invalidateUserSessions(result.id);
  return { id: result.id, role: result.role, active: result.active };
});
