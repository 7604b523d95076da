import { loadTimeline } from "@/lib/server/timeline";
import { scopeOf } from "@/lib/auth/guard";
import { idParam, route } from "@/lib/http/route";
import { encodeTimeline } from "@/lib/timeline/wire";

type P = { patientId: string };

export const GET = route<P>({ roles: ["clinician", "reviewer", "admin"] }, async ({ user, params, ip }) => {
  return encodeTimeline(await loadTimeline(scopeOf(user), idParam(params.patientId), { userId: user.id, action: "patient.timeline.read", ip }));
});
