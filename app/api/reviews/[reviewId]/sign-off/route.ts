import { signOffReview } from "@/lib/server/reviews";
import { scopeOf } from "@/lib/auth/guard";
import { idParam, route } from "@/lib/http/route";

export const POST = route<{ reviewId: string }>({ roles: ["reviewer"] }, async ({ user, params, ip }) => signOffReview(scopeOf(user), idParam(params.reviewId), ip));
