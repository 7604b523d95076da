import { CLINICAL_ROLES } from "@/lib/auth/page-guard";
import { listLesionsForVisit } from "@/db/queries/lesions";
import { createLesion } from "@/lib/server/lesions";
import { scopeOf } from "@/lib/auth/guard";
import { idParam, json, readJson, route } from "@/lib/http/route";
import { createLesionSchema } from "@/lib/validation/lesions";

type P = { visitId: string };

export const GET = route<P>({ roles: CLINICAL_ROLES }, async ({ user, params, ip }) => {
  // The read is audited by the statement that reads the visit.
  return listLesionsForVisit(scopeOf(user), idParam(params.visitId), { userId: user.id, action: "visit.map.read", entityType: "visit", ip });
});

export const POST = route<P>({ roles: ["clinician"] }, async ({ req, user, params, ip }) => {
  const visitId = idParam(params.visitId);
  const input = await readJson(req, createLesionSchema);
  const lesion = await createLesion(scopeOf(user), visitId, input, ip);
  return json({ lesion }, 201);
});
