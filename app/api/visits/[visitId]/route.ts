import { CLINICAL_ROLES } from "@/lib/auth/page-guard";
import { readVisit, updateExamDetails } from "@/lib/server/visit-record";
import { scopeOf } from "@/lib/auth/guard";
import { idParam, readJson, route } from "@/lib/http/route";
import { examDetailsSchema, visitPermissions } from "@/lib/validation/visit-record";

type P = { visitId: string };

export const GET = route<P>({ roles: CLINICAL_ROLES }, async ({ user, params, ip }) => {
  const visit = await readVisit(scopeOf(user), idParam(params.visitId), ip);
  return { visit, permissions: visitPermissions(user, visit) };
});

export const PATCH = route<P>({ roles: ["clinician"] }, async ({ req, user, params, ip }) => {
  const visitId = idParam(params.visitId);
  const input = await readJson(req, examDetailsSchema);
  return { visit: await updateExamDetails(scopeOf(user), visitId, input, ip) };
});
