import "server-only";
// One patient's status-changing writes, serialised: a transaction-level advisory lock keyed by the
// patient. Track statuses are derived from the patient's whole history, so two writes on different
// visits of one patient (which lock different visit rows) would each recompute from a snapshot
// without the other's change, and the later commit would store statuses that miss the earlier
// write. Every transaction that may change a patient's track statuses takes this lock as its
// first statement, so the order of locks is the same everywhere (this one, then rows) and two such
// writes cannot wait on each other in a cycle. PostgreSQL releases it at commit or rollback.
import { and, eq, sql as dsql } from "drizzle-orm";
import { biopsies, visits } from "../schema";
import { prepared, type Tx } from "../client";
import { inScopeParam, siteIdsParam, type SiteScope } from "./scope";

// The two-key form, with a constant first key, keeps these locks apart from any other advisory
// lock; the patient id is hashed to the second key (two patients sharing a hash only wait on
// each other, they are never mixed up).
const PATIENT_STATUS_LOCKS = 20_241;
const lockOf = (patientId: unknown) => dsql<string>`pg_advisory_xact_lock(${PATIENT_STATUS_LOCKS}, hashtext(${patientId}::text))::text`;

const byVisit = prepared((run) =>
  run.select({ locked: lockOf(visits.patientId) }).from(visits).where(and(eq(visits.id, dsql.placeholder("visitId")), inScopeParam(visits.siteId))).limit(1),
);
const byBiopsy = prepared((run) =>
  run
    .select({ locked: lockOf(visits.patientId) })
    .from(biopsies)
    .innerJoin(visits, eq(visits.id, biopsies.visitId))
    .where(and(eq(biopsies.id, dsql.placeholder("biopsyId")), inScopeParam(biopsies.siteId)))
    .limit(1),
);
const byPatient = prepared((run) => run.select({ locked: lockOf(dsql.placeholder("patientId")) }).from(dsql`(select) as one`));

/**
 * Locks the statuses of the patient this visit belongs to (nothing when the visit is not in scope:
 * the statement that follows refuses it). Start it before the transaction's other statements; they
 * may be sent in the same round trip behind it.
 */
export function lockPatientStatusesOfVisit(tx: Tx, scope: SiteScope, visitId: string) {
  return byVisit(tx, { visitId, siteIds: siteIdsParam(scope) });
}

/** The same, for a write that starts from a biopsy (its result). */
export function lockPatientStatusesOfBiopsy(tx: Tx, scope: SiteScope, biopsyId: string) {
  return byBiopsy(tx, { biopsyId, siteIds: siteIdsParam(scope) });
}

/** The same, when the patient is known (scripts and fixtures that recompute statuses). */
export function lockPatientStatuses(tx: Tx, patientId: string) {
  return byPatient(tx, { patientId });
}
