import { adjudicate } from "@/lib/server/reviews";
import { scopeOf } from "@/lib/auth/guard";
import { idParam, readJson, route } from "@/lib/http/route";
import { adjudicationSchema } from "@/lib/validation/tracking";

/** One adjudication per track per review; sending it again replaces it until sign-off. */
export const PUT = route<{ reviewId: string }>({ roles: ["reviewer"] }, async ({ req, user, params, ip }) => {
  const reviewId = idParam(params.reviewId);
  const input = await readJson(req, adjudicationSchema);
  return { adjudication: await adjudicate(scopeOf(user), reviewId, input, ip) };
});
