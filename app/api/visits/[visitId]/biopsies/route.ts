import { createBiopsy, readBiopsiesOfVisit } from "@/lib/server/biopsies";
import { scopeOf } from "@/lib/auth/guard";
import { idParam, json, readJson, route } from "@/lib/http/route";
import { createBiopsySchema } from "@/lib/validation/biopsies";

type P = { visitId: string };

export const GET = route<P>({ roles: ["clinician", "reviewer", "admin"] }, async ({ user, params, ip }) => readBiopsiesOfVisit(scopeOf(user), idParam(params.visitId), ip));

export const POST = route<P>({ roles: ["clinician"] }, async ({ req, user, params, ip }) => {
  const visitId = idParam(params.visitId);
  const input = await readJson(req, createBiopsySchema);
  return json({ biopsy: await createBiopsy(scopeOf(user), visitId, input, ip) }, 201);
});
