import { CLINICAL_ROLES } from "@/lib/auth/page-guard";
import { addTreatment, listTreatments } from "@/lib/server/treatments";
import { scopeOf } from "@/lib/auth/guard";
import { idParam, json, readJson, route } from "@/lib/http/route";
import { treatmentSchema } from "@/lib/validation/treatments";

type P = { visitId: string };

export const GET = route<P>({ roles: CLINICAL_ROLES }, async ({ user, params, ip }) =>
  listTreatments(scopeOf(user), idParam(params.visitId), ip),
);

export const POST = route<P>({ roles: ["clinician"] }, async ({ req, user, params, ip }) => {
  const visitId = idParam(params.visitId);
  const input = await readJson(req, treatmentSchema);
  const r = await addTreatment(scopeOf(user), visitId, input, ip);
  return json({ id: r.id, extent: r.extent, caution: r.extent.level === "caution" ? r.extent.message : null, overridden: r.overridden }, 201);
});
