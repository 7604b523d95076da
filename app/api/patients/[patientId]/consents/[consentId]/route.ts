import { withdrawConsent } from "@/lib/server/studies";
import { scopeOf } from "@/lib/auth/guard";
import { idParam, readJson, route } from "@/lib/http/route";
import { consentWithdrawSchema } from "@/lib/validation/studies";

/** Records the withdrawal of a consent. */
export const PATCH = route<{ patientId: string; consentId: string }>({ roles: ["clinician", "admin"] }, async ({ req, user, params, ip }) => {
  const patientId = idParam(params.patientId);
  const consentId = idParam(params.consentId);
  const { withdrawnOn } = await readJson(req, consentWithdrawSchema);
  return { consent: await withdrawConsent(scopeOf(user), patientId, consentId, withdrawnOn, ip) };
});
