import { signVisit } from "@/lib/server/signing";
import { scopeOf } from "@/lib/auth/guard";
import { idParam, route } from "@/lib/http/route";

/** The examining clinician or an admin; other clinicians of the site get 403 from the service. */
export const POST = route<{ visitId: string }>({ roles: ["clinician", "admin"] }, async ({ user, params, ip }) => {
  const r = await signVisit(scopeOf(user), user, idParam(params.visitId), ip);
  return { id: r.id, status: "signed", signedAt: r.signedAt, version: r.version };
});
