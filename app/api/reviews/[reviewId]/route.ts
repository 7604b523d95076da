import { getReview } from "@/db/queries/reviews";
import { scopeOf } from "@/lib/auth/guard";
import { idParam, route } from "@/lib/http/route";
import { recordAudit } from "@/lib/server/audit";

export const GET = route<{ reviewId: string }>({ roles: ["clinician", "reviewer", "admin"] }, async ({ user, params, ip }) => {
  const r = await getReview(scopeOf(user), idParam(params.reviewId));
  await recordAudit({ userId: user.id, ip, siteId: r.review.siteId, patientId: r.review.patientId, action: "review.read", entityType: "review", entityId: r.review.id });
  return r;
});
