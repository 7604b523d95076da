import { enrolPatient } from "@/lib/server/enrolment";
import { scopeOf } from "@/lib/auth/guard";
import { idParam, json, readJson, route } from "@/lib/http/route";
import { enrolSchema } from "@/lib/validation/research";

/** POST /api/studies/:studyId/enrolments: enrols a consenting patient picked by opaque reference. */
export const POST = route<{ studyId: string }>({ roles: ["research_nurse", "admin"] }, async ({ req, user, params, ip }) => {
  const studyId = idParam(params.studyId);
  const input = await readJson(req, enrolSchema);
  return json(await enrolPatient(scopeOf(user), studyId, input, ip), 201);
});
