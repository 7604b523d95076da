import { scopeOf } from "@/lib/auth/guard";
import { idParam, readJson, route } from "@/lib/http/route";
import { discardDraftVisit } from "@/lib/server/visit-discard";
import { discardVisitSchema } from "@/lib/validation/visits";

type P = { visitId: string };

/** POST /api/visits/:visitId/discard: a draft started by mistake, by its examiner or an administrator. */
export const POST = route<P>({ roles: ["clinician", "admin"] }, async ({ req, user, params, ip }) => {
  const visitId = idParam(params.visitId);
  const { reason } = await readJson(req, discardVisitSchema);
  await discardDraftVisit(scopeOf(user), user, visitId, reason, ip);
  return { ok: true };
});
