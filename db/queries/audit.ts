import "server-only";
import { sql as dsql, type SQL } from "drizzle-orm";
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

const ph = (name: string) => dsql.placeholder(name);

/**
 * The audit of a read, written by the reading statement itself: a data-modifying CTE, used as
 * `run.with(auditOfRead(run, …)).select(…)`, that inserts one row for each row `source` yields
 * (`from … where …`: the record, filtered by the caller's scope) and nothing when the record is
 * not there or not in scope. The read and its audit are then one statement, committed together.
 * `row` gives the record's columns; the caller's values go in as `auditReadValues(audit)`.
 */
export function auditOfRead(run: Db | Tx, row: { siteId: SQL; patientId: SQL; entityId: SQL }, source: SQL) {
  return run.$with("audit_of_read", {}).as(
    dsql`insert into ${auditEvents} (user_id, site_id, patient_id, action, entity_type, entity_id, ip, detail) select ${ph("auditUserId")}::text, ${row.siteId}, ${row.patientId}, ${ph("auditAction")}::text, ${ph("auditEntityType")}::text, ${row.entityId}, ${ph("auditIp")}::text, ${ph("auditDetail")}::jsonb ${source}`,
  );
}

/** The placeholder values of `auditOfRead` for this event (site, patient and entity come from the row). */
export function auditReadValues(e: Omit<AuditInput, "siteId" | "patientId" | "entityId">) {
  return {
    auditUserId: e.userId ?? null,
    auditAction: e.action,
    auditEntityType: e.entityType ?? null,
    auditIp: e.ip ?? null,
    auditDetail: e.detail == null ? null : JSON.stringify(e.detail),
  };
}
