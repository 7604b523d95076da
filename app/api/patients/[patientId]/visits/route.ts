import { createVisit } from "@/lib/server/visits";
import { scopeOf } from "@/lib/auth/guard";
import { idParam, json, readJson, route } from "@/lib/http/route";
import { createVisitSchema } from "@/lib/validation/visits";

export const POST = route<{ patientId: string }>({ roles: ["clinician"] }, async ({ req, user, params, ip }) => {
  const input = await readJson(req, createVisitSchema);
  return json({ visit: await createVisit(scopeOf(user), idParam(params.patientId), input, ip) }, 201);
});
