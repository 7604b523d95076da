import { createVisit } from "@/db/queries/visits";
import { recordAudit } from "@/db/queries/audit-write";
import { scopeOf } from "@/lib/auth/guard";
import { AppError } from "@/lib/errors";
import { idParam, json, readJson, route } from "@/lib/http/route";
import { createVisitSchema } from "@/lib/validation/visits";

export const POST = route<{ patientId: string }>({ roles: ["clinician"] }, async ({ req, user, params, ip }) => {
  const patientId = idParam(params.patientId);
  const input = await readJson(req, createVisitSchema);
  const visit = await createVisit(scopeOf(user), patientId, input);
  if (!visit) throw new AppError("not_found");
  await recordAudit({ userId: user.id, siteId: visit.siteId, patientId, action: "visit.create", entityType: "visit", entityId: visit.id, ip });
  return json({ visit }, 201);
});
