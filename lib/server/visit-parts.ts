import "server-only";
// The parts of a visit record (anaesthetic, complications, diagnoses…) share two shapes: a read of
// the part, audited as a read of the visit; and a change on a draft visit, locked and audited with it.
import { db, type Tx } from "@/db/client";
import { loadVisit, lockDraftVisit, type VisitHeader } from "@/db/queries/visit-access";
import { recordAudit, type AuditInput } from "@/db/queries/audit-write";
import type { SiteScope } from "@/db/queries/scope";

/** Reads one part of a visit the caller may see; the read is audited as `visit.<part>.read`. */
export async function readVisitPart<T>(scope: SiteScope, visitId: string, ip: string, part: string, read: (visit: VisitHeader) => Promise<T>): Promise<T> {
  const visit = await loadVisit(db, scope, visitId);
  const result = await read(visit);
  await recordAudit({ userId: scope.userId, siteId: visit.siteId, patientId: visit.patientId, action: `visit.${part}.read`, entityType: "visit", entityId: visit.id, ip });
  return result;
}

type ChangeAudit = Pick<AuditInput, "action" | "entityType" | "entityId" | "detail">;

/**
 * Changes a draft visit (the visit row locked first, so concurrent writers queue; a signed visit
 * is refused), and records the change in the same transaction.
 */
export async function changeDraftVisit<T>(
  scope: SiteScope, visitId: string, ip: string,
  change: (tx: Tx, visit: VisitHeader) => Promise<T>,
  audit: (result: T, visit: VisitHeader) => ChangeAudit,
): Promise<T> {
  return db.transaction(async (tx) => {
    const visit = await lockDraftVisit(tx, scope, visitId);
    const result = await change(tx, visit);
    await recordAudit({ userId: scope.userId, siteId: visit.siteId, patientId: visit.patientId, ip, ...audit(result, visit) }, tx);
    return result;
  });
}
