import "server-only";
import { db } from "../client";
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

export async function recordAudit(e: AuditInput): Promise<void> {
  await db.insert(auditEvents).values({
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
