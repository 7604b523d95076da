import "server-only";
import { sql as dsql } from "drizzle-orm";
import { db, prepared, type Db, type Tx } from "../client";
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

// Built once: nearly every request writes one. The detail goes in as JSON text (a null stays SQL NULL).
const insertAudit = prepared((run) =>
  run.insert(auditEvents).values({
    userId: dsql.placeholder("userId"),
    siteId: dsql.placeholder("siteId"),
    patientId: dsql.placeholder("patientId"),
    action: dsql.placeholder("action"),
    entityType: dsql.placeholder("entityType"),
    entityId: dsql.placeholder("entityId"),
    ip: dsql.placeholder("ip"),
    detail: dsql`${dsql.placeholder("detail")}::jsonb`,
  }),
);

/** Pass the transaction when the event belongs to a change, so both commit or neither does. */
export async function recordAudit(e: AuditInput, run: Db | Tx = db): Promise<void> {
  await insertAudit(run, {
    userId: e.userId ?? null,
    siteId: e.siteId ?? null,
    patientId: e.patientId ?? null,
    action: e.action,
    entityType: e.entityType ?? null,
    entityId: e.entityId ?? null,
    ip: e.ip ?? null,
    detail: e.detail == null ? null : JSON.stringify(e.detail),
  });
}
