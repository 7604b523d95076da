import { confirmDiagnosis, getDiagnoses, unconfirmDiagnosis } from "@/db/queries/diagnoses";
import { recordAudit } from "@/db/queries/audit-write";
import { scopeOf } from "@/lib/auth/guard";
import { idParam, json, readJson, readQuery, route } from "@/lib/http/route";
import { confirmDiagnosisSchema, diagnosisQuery } from "@/lib/validation/visit-record";

type P = { visitId: string };

export const GET = route<P>({ roles: ["clinician", "reviewer", "research_nurse", "admin"] }, async ({ user, params, ip }) => {
  const { visit, ...rest } = await getDiagnoses(scopeOf(user), idParam(params.visitId));
  await recordAudit({ userId: user.id, siteId: visit.siteId, patientId: visit.patientId, action: "visit.diagnoses.read", entityType: "visit", entityId: visit.id, ip });
  return rest;
});

export const POST = route<P>({ roles: ["clinician"] }, async ({ req, user, params, ip }) => {
  const visitId = idParam(params.visitId);
  const { code } = await readJson(req, confirmDiagnosisSchema);
  const r = await confirmDiagnosis(scopeOf(user), user.id, visitId, code);
  await recordAudit({ userId: user.id, siteId: r.visit.siteId, patientId: r.visit.patientId, action: "diagnosis.confirm", entityType: "visit", entityId: r.visit.id, ip, detail: { code: r.code, why: r.why } });
  return json({ code: r.code }, 201);
});

/** Un-confirm while the visit is a draft: DELETE ?code=K62.82 */
export const DELETE = route<P>({ roles: ["clinician"] }, async ({ req, user, params, ip }) => {
  const visitId = idParam(params.visitId);
  const { code } = readQuery(req, diagnosisQuery);
  const r = await unconfirmDiagnosis(scopeOf(user), visitId, code);
  await recordAudit({ userId: user.id, siteId: r.visit.siteId, patientId: r.visit.patientId, action: "diagnosis.unconfirm", entityType: "visit", entityId: r.visit.id, ip, detail: { code } });
  return { ok: true };
});
