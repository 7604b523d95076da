import { resolveAdjudication } from "@/lib/server/reviews";
import { scopeOf } from "@/lib/auth/guard";
import { idParam, route } from "@/lib/http/route";

export const POST = route<{ adjudicationId: string }>({ roles: ["clinician", "admin"] }, async ({ user, params, ip }) => resolveAdjudication(scopeOf(user), idParam(params.adjudicationId), ip));
