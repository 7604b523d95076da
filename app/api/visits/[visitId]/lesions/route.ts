import { createLesion, listLesionsForVisit } from "@/db/queries/lesions";
import { recordAudit } from "@/db/queries/audit";
import { scopeOf } from "@/lib/auth/guard";
import { idParam, json, readJson, route } from "@/lib/http/route";
import { createLesionSchema } from "@/lib/validation/lesions";

type P = { visitId: string };

export const GET = route<P>({ roles: ["clinician", "reviewer", "research_nurse", "admin"] }, async ({ user, params, ip }) => {
  const data = await listLesionsForVisit(scopeOf(user), idParam(params.visitId));
  await recordAudit({ userId: user.id, patientId: data.visit.patientId, action: "visit.map.read", entityType: "visit", entityId: data.visit.id, ip });
  return data;
});

export const POST = route<P>({ roles: ["clinician"] }, async ({ req, user, params, ip }) => {
  const visitId = idParam(params.visitId);
  const input = await readJson(req, createLesionSchema);
  const lesion = await createLesion(scopeOf(user), visitId, input, ip);
  return json({ lesion }, 201);
});
