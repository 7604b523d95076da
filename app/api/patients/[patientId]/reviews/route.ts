import { listDisagreements } from "@/db/queries/reviews";
import { requestReview } from "@/lib/server/reviews";
import { scopeOf } from "@/lib/auth/guard";
import { idParam, json, readJson, route } from "@/lib/http/route";
import { recordAudit } from "@/lib/server/audit";
import { requestReviewSchema } from "@/lib/validation/tracking";

type P = { patientId: string };

export const GET = route<P>({ roles: ["clinician", "reviewer", "admin"] }, async ({ user, params, ip }) => {
  const patientId = idParam(params.patientId);
  const all = await listDisagreements(scopeOf(user), patientId);
  await recordAudit({ userId: user.id, ip, patientId, action: "review.list", entityType: "patient", entityId: patientId });
  return { openDisagreements: all.filter((d) => !d.resolvedAt), resolvedDisagreements: all.filter((d) => d.resolvedAt) };
});

export const POST = route<P>({ roles: ["clinician", "reviewer", "admin"] }, async ({ req, user, params, ip }) => {
  const patientId = idParam(params.patientId);
  const input = await readJson(req, requestReviewSchema);
  return json({ review: await requestReview(scopeOf(user), patientId, input, ip) }, 201);
});
