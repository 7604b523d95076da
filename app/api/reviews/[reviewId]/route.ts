import { getReview } from "@/db/queries/reviews";
import { scopeOf } from "@/lib/auth/guard";
import { idParam, route } from "@/lib/http/route";

export const GET = route<{ reviewId: string }>({ roles: ["clinician", "reviewer", "admin"] }, async ({ user, params }) => getReview(scopeOf(user), idParam(params.reviewId)));
