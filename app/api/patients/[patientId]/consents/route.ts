import { recordConsent } from "@/lib/server/studies";
import { scopeOf } from "@/lib/auth/guard";
import { idParam, json, readJson, route } from "@/lib/http/route";
import { consentSchema } from "@/lib/validation/studies";

/** Records the patient's research consent to one study. */
export const POST = route<{ patientId: string }>({ roles: ["clinician", "admin"] }, async ({ req, user, params, ip }) => {
  const patientId = idParam(params.patientId);
  const input = await readJson(req, consentSchema);
  return json({ consent: await recordConsent(scopeOf(user), patientId, input, ip) }, 201);
});
