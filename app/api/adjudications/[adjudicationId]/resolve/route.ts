import { resolveAdjudication } from "@/lib/server/reviews";
import { scopeOf } from "@/lib/auth/guard";
import { idParam, readJson, route } from "@/lib/http/route";
import { resolveDisagreementSchema } from "@/lib/validation/tracking";

/** The clinician settles a reviewer's disagreement, saying which status stands. */
export const POST = route<{ adjudicationId: string }>({ roles: ["clinician", "admin"] }, async ({ req, user, params, ip }) => {
  const adjudicationId = idParam(params.adjudicationId);
  const input = await readJson(req, resolveDisagreementSchema);
  return resolveAdjudication(scopeOf(user), adjudicationId, input, ip);
});
