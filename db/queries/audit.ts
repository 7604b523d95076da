import "server-only";
import { db, type Db, type Tx } from "../client";
import { auditEvents } from "../schema";

export interface AuditInput {
  userId?: string | null;
  siteId?: string | null;
  patientId?: string | null;
  action: string;
  entityType?: string;
  entityId?: string;
  ip?: string | null;
  detail?: Record<string, unknown>;
}

/** Pass the transaction when the event belongs to a change, so both commit or neither does. */
export async function recordAudit(e: AuditInput, run: Db | Tx = db): Promise<void> {
  await run.insert(auditEvents).values({
    userId: e.userId ?? null,
    siteId: e.siteId ?? null,
    patientId: e.patientId ?? null,
    action: e.action,
    entityType: e.entityType,
    entityId: e.entityId,
    ip: e.ip ?? null,
    detail: e.detail ?? null,
  });
}
