import { applyTrackAction, loadFollowUpContext, readFollowUpContext } from "@/lib/server/refind";
import { scopeOf } from "@/lib/auth/guard";
import { idParam, readJson, route } from "@/lib/http/route";
import { trackActionSchema } from "@/lib/validation/tracking";

type P = { visitId: string };

/** Earlier tracks as faint outlines, marks at this visit, and suggested links. */
export const GET = route<P>({ roles: ["clinician", "reviewer", "admin"] }, async ({ user, params, ip }) => readFollowUpContext(scopeOf(user), idParam(params.visitId), ip));

export const POST = route<P>({ roles: ["clinician"] }, async ({ req, user, params, ip }) => {
  const visitId = idParam(params.visitId);
  const action = await readJson(req, trackActionSchema);
  await applyTrackAction(scopeOf(user), visitId, action, ip);
  return loadFollowUpContext(scopeOf(user), visitId);
});
