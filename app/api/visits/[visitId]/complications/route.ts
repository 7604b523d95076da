import { CLINICAL_ROLES } from "@/lib/auth/page-guard";
import { addComplication, listComplications } from "@/lib/server/complications";
import { scopeOf } from "@/lib/auth/guard";
import { idParam, json, readJson, route } from "@/lib/http/route";
import { complicationSchema } from "@/lib/validation/visit-record";

type P = { visitId: string };

export const GET = route<P>({ roles: CLINICAL_ROLES }, async ({ user, params, ip }) => ({
  complications: await listComplications(scopeOf(user), idParam(params.visitId), ip),
}));

export const POST = route<P>({ roles: ["clinician"] }, async ({ req, user, params, ip }) => {
  const visitId = idParam(params.visitId);
  const input = await readJson(req, complicationSchema);
  return json({ id: await addComplication(scopeOf(user), visitId, input, ip) }, 201);
});
