import { listOpenDisagreements } from "@/db/queries/reviews";
import { requestReview } from "@/lib/server/reviews";
import { scopeOf } from "@/lib/auth/guard";
import { idParam, json, readJson, route } from "@/lib/http/route";
import { requestReviewSchema } from "@/lib/validation/tracking";

type P = { patientId: string };

export const GET = route<P>({ roles: ["clinician", "reviewer", "admin"] }, async ({ user, params }) => ({
  openDisagreements: await listOpenDisagreements(scopeOf(user), idParam(params.patientId)),
}));

export const POST = route<P>({ roles: ["clinician", "reviewer", "admin"] }, async ({ req, user, params, ip }) => {
  const patientId = idParam(params.patientId);
  const input = await readJson(req, requestReviewSchema);
  return json({ review: await requestReview(scopeOf(user), patientId, input, ip) }, 201);
});
