import { loadTimeline } from "@/db/queries/timeline";
import { recordAudit } from "@/db/queries/audit";
import { scopeOf } from "@/lib/auth/guard";
import { idParam, route } from "@/lib/http/route";

type P = { patientId: string };

export const GET = route<P>({ roles: ["clinician", "reviewer", "admin"] }, async ({ user, params, ip }) => {
  const data = await loadTimeline(scopeOf(user), idParam(params.patientId));
  await recordAudit({ userId: user.id, siteId: data.patient.siteId, patientId: data.patient.id, action: "patient.timeline.read", ip });
  return data;
});
