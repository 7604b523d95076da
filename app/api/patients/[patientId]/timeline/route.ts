import { loadTimeline } from "@/lib/server/timeline";
import { scopeOf } from "@/lib/auth/guard";
import { idParam, route } from "@/lib/http/route";

type P = { patientId: string };

export const GET = route<P>({ roles: ["clinician", "reviewer", "admin"] }, async ({ user, params, ip }) => {
  return loadTimeline(scopeOf(user), idParam(params.patientId), { userId: user.id, action: "patient.timeline.read", ip });
});
