import "server-only";
// Reading the audit trail for admins. There is no update or delete here, and the table refuses
// them anyway (append-only trigger).
import { and, count, desc, eq, gte, inArray, isNull, lt, or, sql, type SQL } from "drizzle-orm";
import { db } from "../client";
import { auditEvents, patients, users, userSites } from "../schema";

export const AUDIT_PAGE_SIZE = 50;

export interface AuditFilters {
  userId?: string;
  /** Exact action, or a prefix ending in "." ("sign_in." lists every sign-in event). */
  action?: string;
  patientId?: string;
  /** The patient's MRN as staff know it (exact, ignoring case), instead of the internal id. */
  patientMrn?: string;
  fromDate?: string;
  toDate?: string;
  page?: number;
}

/**
 * Events at the admin's sites, plus site-less events (sign-ins, resets, account changes) of
 * their colleagues, which an admin must see to follow who got in.
 */
export async function listAuditEvents(siteIds: string[], f: AuditFilters) {
  // A site-less event is shown when it names no user (a failed sign-in with an unknown
  // address) or a user of one of the admin's sites, so one site's admin cannot follow another's staff.
  const colleagues = db.select({ id: userSites.userId }).from(userSites).where(inArray(userSites.siteId, siteIds.length ? siteIds : ["00000000-0000-0000-0000-000000000000"]));
  const siteless = and(isNull(auditEvents.siteId), or(isNull(auditEvents.userId), inArray(auditEvents.userId, colleagues)));
  const siteClause = siteIds.length ? or(inArray(auditEvents.siteId, siteIds), siteless) : siteless;
  const where = and(
    siteClause,
    f.userId ? eq(auditEvents.userId, f.userId) : undefined,
    actionClause(f.action),
    f.patientId ? eq(auditEvents.patientId, f.patientId) : undefined,
    f.patientMrn ? inArray(auditEvents.patientId, db.select({ id: patients.id }).from(patients).where(sql`lower(${patients.mrn}) = lower(${f.patientMrn})`)) : undefined,
    f.fromDate ? gte(auditEvents.at, new Date(`${f.fromDate}T00:00:00Z`)) : undefined,
    f.toDate ? lt(auditEvents.at, new Date(new Date(`${f.toDate}T00:00:00Z`).getTime() + 86_400_000)) : undefined,
  );
  const page = Math.max(1, f.page ?? 1);
  const [rows, [{ total }]] = await Promise.all([
    db
      .select({
        id: auditEvents.id, at: auditEvents.at, userId: auditEvents.userId, userName: users.displayName, action: auditEvents.action,
        entityType: auditEvents.entityType, entityId: auditEvents.entityId, patientId: auditEvents.patientId, patientMrn: patients.mrn,
        ip: auditEvents.ip, detail: auditEvents.detail,
      })
      .from(auditEvents)
      .leftJoin(users, eq(users.id, auditEvents.userId))
      .leftJoin(patients, eq(patients.id, auditEvents.patientId))
      .where(where)
      .orderBy(desc(auditEvents.at), desc(auditEvents.id))
      .limit(AUDIT_PAGE_SIZE)
      .offset((page - 1) * AUDIT_PAGE_SIZE),
    db.select({ total: count() }).from(auditEvents).where(where),
  ]);
  return { rows, total, page, pageCount: Math.max(1, Math.ceil(total / AUDIT_PAGE_SIZE)) };
}

function actionClause(action: string | undefined): SQL | undefined {
  if (!action) return undefined;
  if (action.endsWith(".")) {
    // Prefix match without LIKE wildcards from user input: compare the range [prefix, prefix+1).
    const next = action.slice(0, -1) + String.fromCharCode(action.charCodeAt(action.length - 1) + 1);
    return and(gte(auditEvents.action, action), lt(auditEvents.action, next));
  }
  return eq(auditEvents.action, action);
}

/** The distinct actions recorded so far, for the filter list. */
export async function listAuditActions(): Promise<string[]> {
  const rows = await db.selectDistinct({ action: auditEvents.action }).from(auditEvents).orderBy(auditEvents.action).limit(500);
  return rows.map((r) => r.action);
}
