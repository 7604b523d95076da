import { signVisit } from "@/db/queries/signing";
import { recordAudit } from "@/db/queries/audit-write";
import { scopeOf } from "@/lib/auth/guard";
import { idParam, route } from "@/lib/http/route";

/** The examining clinician or an admin; other clinicians of the site get 403 from the query. */
export const POST = route<{ visitId: string }>({ roles: ["clinician", "admin"] }, async ({ user, params, ip }) => {
  const r = await signVisit(scopeOf(user), user, idParam(params.visitId));
  await recordAudit({ userId: user.id, siteId: r.siteId, patientId: r.patientId, action: "visit.sign", entityType: "visit", entityId: r.id, ip, detail: { version: r.version } });
  return { id: r.id, status: "signed", signedAt: r.signedAt, version: r.version };
});
