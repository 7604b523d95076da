import { CLINICAL_ROLES } from "@/lib/auth/page-guard";
import { addAddendum, readAddenda } from "@/lib/server/signing";
import { scopeOf } from "@/lib/auth/guard";
import { idParam, json, readJson, route } from "@/lib/http/route";
import { addendumSchema } from "@/lib/validation/visit-record";

type P = { visitId: string };

export const GET = route<P>({ roles: CLINICAL_ROLES }, async ({ user, params, ip }) => {
  return { addenda: await readAddenda(scopeOf(user), idParam(params.visitId), ip) };
});

export const POST = route<P>({ roles: ["clinician", "admin"] }, async ({ req, user, params, ip }) => {
  const visitId = idParam(params.visitId);
  const { body } = await readJson(req, addendumSchema);
  const r = await addAddendum(scopeOf(user), user.id, visitId, body, ip);
  return json({ id: r.id, createdAt: r.createdAt }, 201);
});
