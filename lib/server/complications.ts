import "server-only";
import { complicationsOfVisit, deleteComplicationRow, insertComplication } from "@/db/queries/complications";
import type { SiteScope } from "@/db/queries/scope";
import { AppError } from "@/lib/errors";
import type { ComplicationInput } from "@/lib/validation/visit-record";
import { changeDraftVisit, readVisitPart } from "./visit-parts";

export function listComplications(scope: SiteScope, visitId: string, ip: string) {
  return readVisitPart(scope, visitId, ip, "complications", async (v) => {
    const rows = await complicationsOfVisit(v.id);
    return rows.map(({ afterProcedure, ...r }) => ({ ...r, timing: afterProcedure ? ("after" as const) : ("during" as const) }));
  });
}

export function addComplication(scope: SiteScope, visitId: string, input: ComplicationInput, ip: string) {
  return changeDraftVisit(
    scope, visitId, ip,
    (tx, v) => insertComplication(tx, { visitId: v.id, siteId: v.siteId, kind: input.kind, severity: input.severity, afterProcedure: input.timing === "after", note: input.note ?? null }),
    (id) => ({ action: "complication.create", entityType: "complication", entityId: id, detail: { kind: input.kind, severity: input.severity, timing: input.timing } }),
  );
}

export function deleteComplication(scope: SiteScope, visitId: string, complicationId: string, ip: string) {
  return changeDraftVisit(
    scope, visitId, ip,
    async (tx, v) => {
      if (!(await deleteComplicationRow(tx, complicationId, v.id))) throw new AppError("not_found");
    },
    () => ({ action: "complication.delete", entityType: "complication", entityId: complicationId }),
  );
}
