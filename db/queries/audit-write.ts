import "server-only";
import { sql as dsql, type SQL } from "drizzle-orm";
import { db, prepared, type Db, type Tx } from "../client";
import { auditEvents } from "../schema";
import { pgArrayLiteral } from "./scope";

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

/** The read of a record, audited by `auditOfRead`: site, patient and entity come from the record's row. */
export type ReadAudit = Omit<AuditInput, "siteId" | "patientId" | "entityId">;

const ph = (name: string) => dsql.placeholder(name);

/**
 * One event's values, named as the placeholders of both audit statements (`insertAudit` and
 * `auditOfRead`, which takes what it needs). The detail goes in as JSON text (a null stays SQL NULL).
 */
export function auditValues(e: AuditInput) {
  return {
    auditUserId: e.userId ?? null,
    auditSiteId: e.siteId ?? null,
    auditPatientId: e.patientId ?? null,
    auditAction: e.action,
    auditEntityType: e.entityType ?? null,
    auditEntityId: e.entityId ?? null,
    auditIp: e.ip ?? null,
    auditDetail: e.detail == null ? null : JSON.stringify(e.detail),
  };
}

// Built once: nearly every request writes one.
const insertAudit = prepared((run) =>
  run.insert(auditEvents).values({
    userId: ph("auditUserId"),
    siteId: ph("auditSiteId"),
    patientId: ph("auditPatientId"),
    action: ph("auditAction"),
    entityType: ph("auditEntityType"),
    entityId: ph("auditEntityId"),
    ip: ph("auditIp"),
    detail: dsql`${ph("auditDetail")}::jsonb`,
  }),
);

/** Pass the transaction when the event belongs to a change, so both commit or neither does. */
export async function recordAudit(e: AuditInput, run: Db | Tx = db): Promise<void> {
  await insertAudit(run, auditValues(e));
}

/**
 * Many events in one statement (a bulk change audits each record it changed): one array
 * parameter per column, turned back into rows by unnest, so the text is the same for any count.
 */
export async function recordAudits(events: AuditInput[], run: Db | Tx = db): Promise<void> {
  if (events.length === 0) return;
  const v = events.map(auditValues);
  const col = <K extends keyof ReturnType<typeof auditValues>>(k: K) => pgArrayLiteral(v.map((e) => e[k]));
  await run.execute(
    dsql`insert into ${auditEvents} (user_id, site_id, patient_id, action, entity_type, entity_id, ip, detail) select * from unnest(${col("auditUserId")}::text[], ${col("auditSiteId")}::uuid[], ${col("auditPatientId")}::uuid[], ${col("auditAction")}::text[], ${col("auditEntityType")}::text[], ${col("auditEntityId")}::text[], ${col("auditIp")}::text[], ${col("auditDetail")}::jsonb[])`,
  );
}

/**
 * The audit of a read, written by the reading statement itself: a data-modifying CTE, used as
 * `run.with(auditOfRead(run, …)).select(…)`, that inserts one row for each row `source` yields
 * (`from … where …`: the record, filtered by the caller's scope) and nothing when the record is
 * not there or not in scope. The read and its audit are then one statement, committed together.
 * `row` gives the record's columns; the caller's values go in as `auditValues(audit)`.
 */
export function auditOfRead(run: Db | Tx, row: { siteId: SQL; patientId: SQL; entityId: SQL }, source: SQL) {
  return run.$with("audit_of_read", {}).as(auditInsert(row, source));
}

/**
 * The audit of a write, as part of the write's own statement (a data-modifying CTE,
 * `with …, audit as (${auditOfWrite(dsql`from changed`)})`): one row for each row `source` yields
 * (`from <the CTE that wrote>`), so a write that changed nothing records nothing, and the change
 * and its audit are one statement, committed together. Its values are the placeholders of
 * `auditValues`, for a statement built once (`preparedSql`).
 */
export function auditOfWrite(source: SQL): SQL {
  return auditInsert({ siteId: dsql`${ph("auditSiteId")}::uuid`, patientId: dsql`${ph("auditPatientId")}::uuid`, entityId: dsql`${ph("auditEntityId")}::text` }, source);
}

/** One audit row for each row of `source`: the caller's values as `auditValues` placeholders, site, patient and entity as given. */
function auditInsert(row: { siteId: SQL; patientId: SQL; entityId: SQL }, source: SQL): SQL {
  return dsql`insert into ${auditEvents} (user_id, site_id, patient_id, action, entity_type, entity_id, ip, detail) select ${ph("auditUserId")}::text, ${row.siteId}, ${row.patientId}, ${ph("auditAction")}::text, ${ph("auditEntityType")}::text, ${row.entityId}, ${ph("auditIp")}::text, ${ph("auditDetail")}::jsonb ${source}`;
}
