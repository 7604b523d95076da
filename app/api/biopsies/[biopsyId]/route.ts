import { deleteBiopsy, enterHistology } from "@/lib/server/biopsies";
import { scopeOf } from "@/lib/auth/guard";
import { idParam, readJson, route } from "@/lib/http/route";
import { histologyResultSchema } from "@/lib/validation/biopsies";

type P = { biopsyId: string };

/** Enter (or correct) the histology result. */
export const PATCH = route<P>({ roles: ["clinician"] }, async ({ req, user, params, ip }) => {
  const id = idParam(params.biopsyId);
  const input = await readJson(req, histologyResultSchema);
  return { biopsy: await enterHistology(scopeOf(user), id, input, ip) };
});

export const DELETE = route<P>({ roles: ["clinician"] }, async ({ user, params, ip }) => {
  await deleteBiopsy(scopeOf(user), idParam(params.biopsyId), ip);
  return { ok: true };
});
