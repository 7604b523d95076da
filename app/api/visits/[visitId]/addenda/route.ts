import { addAddendum, listAddenda } from "@/db/queries/signing";
import { recordAudit } from "@/db/queries/audit-write";
import { scopeOf } from "@/lib/auth/guard";
import { idParam, json, readJson, route } from "@/lib/http/route";
import { addendumSchema } from "@/lib/validation/visit-record";

type P = { visitId: string };

export const GET = route<P>({ roles: ["clinician", "reviewer", "research_nurse", "admin"] }, async ({ user, params, ip }) => {
  const { visit, addenda } = await listAddenda(scopeOf(user), idParam(params.visitId));
  await recordAudit({ userId: user.id, siteId: visit.siteId, patientId: visit.patientId, action: "visit.addenda.read", entityType: "visit", entityId: visit.id, ip });
  return { addenda };
});

export const POST = route<P>({ roles: ["clinician", "admin"] }, async ({ req, user, params, ip }) => {
  const visitId = idParam(params.visitId);
  const { body } = await readJson(req, addendumSchema);
  const r = await addAddendum(scopeOf(user), user.id, visitId, body);
  await recordAudit({ userId: user.id, siteId: r.visit.siteId, patientId: r.visit.patientId, action: "addendum.create", entityType: "addendum", entityId: r.id, ip });
  return json({ id: r.id, createdAt: r.createdAt }, 201);
});
