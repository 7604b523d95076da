import { saveDisplayConvention } from "@/lib/server/preferences";
import { readJson, route } from "@/lib/http/route";
import { preferencesSchema } from "@/lib/validation/visits";

export const GET = route({ roles: "any" }, async ({ user }) => ({ displayConvention: user.displayConvention }));

export const PATCH = route({ roles: "any" }, async ({ req, user }) => {
  const input = await readJson(req, preferencesSchema);
  await saveDisplayConvention(user.id, input.displayConvention);
  return { displayConvention: input.displayConvention };
});
