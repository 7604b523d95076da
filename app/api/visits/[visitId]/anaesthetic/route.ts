import { CLINICAL_ROLES } from "@/lib/auth/page-guard";
import { addDose, listDoses } from "@/lib/server/anaesthetic";
import { scopeOf } from "@/lib/auth/guard";
import { idParam, json, readJson, route } from "@/lib/http/route";
import { anaestheticSchema } from "@/lib/validation/treatments";

type P = { visitId: string };

export const GET = route<P>({ roles: CLINICAL_ROLES }, async ({ user, params, ip }) =>
  listDoses(scopeOf(user), idParam(params.visitId), ip),
);

/** mg and the running totals are computed here from % and mL; any client figure is stripped by the schema. */
export const POST = route<P>({ roles: ["clinician"] }, async ({ req, user, params, ip }) => {
  const visitId = idParam(params.visitId);
  const input = await readJson(req, anaestheticSchema);
  const r = await addDose(scopeOf(user), visitId, input, ip);
  return json({ id: r.id, doseMg: r.doseMg, assessment: r.gate.after, over: r.gate.over, near: r.gate.near, message: r.gate.message }, 201);
});
