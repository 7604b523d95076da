import { deleteLesion, updateLesion } from "@/lib/server/lesions";
import { scopeOf } from "@/lib/auth/guard";
import { idParam, readJson, readQuery, route } from "@/lib/http/route";
import { deleteLesionQuery, updateLesionSchema } from "@/lib/validation/lesions";

type P = { visitId: string; lesionId: string };

export const PATCH = route<P>({ roles: ["clinician"] }, async ({ req, user, params, ip }) => {
  const visitId = idParam(params.visitId);
  const lesionId = idParam(params.lesionId);
  const input = await readJson(req, updateLesionSchema);
  return { lesion: await updateLesion(scopeOf(user), visitId, lesionId, input, ip) };
});

export const DELETE = route<P>({ roles: ["clinician"] }, async ({ req, user, params, ip }) => {
  const visitId = idParam(params.visitId);
  const lesionId = idParam(params.lesionId);
  const { version } = readQuery(req, deleteLesionQuery);
  await deleteLesion(scopeOf(user), visitId, lesionId, version, ip);
  return { ok: true };
});
