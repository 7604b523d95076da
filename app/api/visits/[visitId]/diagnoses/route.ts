import { CLINICAL_ROLES } from "@/lib/auth/page-guard";
import { confirmDiagnosis, getDiagnoses, unconfirmDiagnosis } from "@/lib/server/diagnoses";
import { scopeOf } from "@/lib/auth/guard";
import { idParam, json, readJson, readQuery, route } from "@/lib/http/route";
import { confirmDiagnosisSchema, diagnosisQuery } from "@/lib/validation/visit-record";

type P = { visitId: string };

export const GET = route<P>({ roles: CLINICAL_ROLES }, async ({ user, params, ip }) =>
  getDiagnoses(scopeOf(user), idParam(params.visitId), ip),
);

export const POST = route<P>({ roles: ["clinician"] }, async ({ req, user, params, ip }) => {
  const visitId = idParam(params.visitId);
  const { code } = await readJson(req, confirmDiagnosisSchema);
  const r = await confirmDiagnosis(scopeOf(user), visitId, code, ip);
  return json({ code: r.code }, 201);
});

/** Un-confirm while the visit is a draft: DELETE ?code=K62.82 */
export const DELETE = route<P>({ roles: ["clinician"] }, async ({ req, user, params, ip }) => {
  const visitId = idParam(params.visitId);
  const { code } = readQuery(req, diagnosisQuery);
  await unconfirmDiagnosis(scopeOf(user), visitId, code, ip);
  return { ok: true };
});
