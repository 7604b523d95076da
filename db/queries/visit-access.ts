import "server-only";
import { and, eq, sql as dsql } from "drizzle-orm";
import { lesions, patients, sites, visits } from "../schema";
import { prepared, type Db, type Tx } from "../client";
import { inScopeParam, siteIdsParam, type SiteScope } from "./scope";
import { auditOfRead, auditValues, type ReadAudit } from "./audit-write";
import { AppError } from "@/lib/errors";

const visitColumns = {
  id: visits.id,
  patientId: visits.patientId,
  siteId: visits.siteId,
  visitDate: visits.visitDate,
  status: visits.status,
  examinerId: visits.examinerId,
  patientPosition: visits.patientPosition,
  patientWeightKg: visits.patientWeightKg,
  version: visits.version,
};

const visitInScope = and(eq(visits.id, dsql.placeholder("visitId")), inScopeParam(visits.siteId));

// Built once: every visit page and every change to a visit starts with one of these.
const visitHeader = prepared((run) => run.select(visitColumns).from(visits).where(visitInScope).limit(1));
const visitHeaderForUpdate = prepared((run) => run.select(visitColumns).from(visits).where(visitInScope).for("update").limit(1));
// The same with every field the exam form saves, so a save that changes nothing can be told.
const examColumns = {
  ...visitColumns, indication: visits.indication, cytology: visits.cytology, hpvResult: visits.hpvResult, adequacy: visits.adequacy,
  examStartedAt: visits.examStartedAt, examEndedAt: visits.examEndedAt, anaesthesia: visits.anaesthesia, plan: visits.plan,
};
// And the patient's birth date, which bounds the exam's days (a lock of the visit row only).
const examForUpdate = prepared((run) =>
  run
    .select({ ...examColumns, patientBirthDate: patients.dateOfBirth })
    .from(visits)
    .innerJoin(patients, eq(patients.id, visits.patientId))
    .where(visitInScope)
    .for("update", { of: visits })
    .limit(1),
);

// The same, also writing the read's audit row (auditOfRead) when the visit is in scope.
const visitHeaderAudited = prepared((run) =>
  run
    .with(auditOfRead(run, { siteId: dsql`${visits.siteId}`, patientId: dsql`${visits.patientId}`, entityId: dsql`${visits.id}::text` }, dsql`from ${visits} where ${visitInScope}`))
    .select(visitColumns)
    .from(visits)
    .where(visitInScope)
    .limit(1),
);

// The same, narrowed to one patient: a visit page whose visit is not the URL's patient's finds
// nothing, so it answers 404 without recording a read.
const visitOfPatientInScope = and(visitInScope, eq(visits.patientId, dsql.placeholder("patientId")));
const visitHeaderAuditedOfPatient = prepared((run) =>
  run
    .with(auditOfRead(run, { siteId: dsql`${visits.siteId}`, patientId: dsql`${visits.patientId}`, entityId: dsql`${visits.id}::text` }, dsql`from ${visits} where ${visitOfPatientInScope}`))
    .select(visitColumns)
    .from(visits)
    .where(visitOfPatientInScope)
    .limit(1),
);

export type VisitHeader = Awaited<ReturnType<typeof loadVisit>>;

/** A visit the caller's sites may see, or not_found. */
export async function loadVisit(run: Db | Tx, scope: SiteScope, visitId: string) {
  const [v] = await visitHeader(run, { visitId, siteIds: siteIdsParam(scope) });
  if (!v) throw new AppError("not_found");
  return v;
}

/**
 * loadVisit, and the read recorded in the audit log by the same statement (the visit's site,
 * patient and id completed from the row), only when the visit is in scope.
 */
export async function loadVisitAudited(run: Db | Tx, scope: SiteScope, visitId: string, audit: ReadAudit, patientId?: string) {
  const values = { visitId, siteIds: siteIdsParam(scope), ...auditValues(audit) };
  const [v] = patientId ? await visitHeaderAuditedOfPatient(run, { ...values, patientId }) : await visitHeaderAudited(run, values);
  if (!v) throw new AppError("not_found");
  return v;
}

/**
 * Inside a transaction: locks the visit row so concurrent writers queue, and refuses a signed
 * visit (423: changes to a signed visit go in an addendum).
 */
export async function lockDraftVisit(tx: Tx, scope: SiteScope, visitId: string) {
  const [v] = await visitHeaderForUpdate(tx, { visitId, siteIds: siteIdsParam(scope) });
  if (!v) throw new AppError("not_found");
  if (v.status === "signed") throw new AppError("locked");
  return v;
}

/** lockDraftVisit, with the exam details as stored. */
export async function lockDraftVisitForExam(tx: Tx, scope: SiteScope, visitId: string) {
  const [v] = await examForUpdate(tx, { visitId, siteIds: siteIdsParam(scope) });
  if (!v) throw new AppError("not_found");
  if (v.status === "signed") throw new AppError("locked");
  return v;
}

// lockDraftVisitForLesion's statement, one per shape, each built once.
function lockForLesion(opts: { lockPatient: boolean; withLesion: boolean }) {
  return prepared((run) => {
    const base = run
      .select({
        visit: { ...visitColumns, zoneBounds: sites.zoneBounds },
        // Every field a lesion update may change, so the service can tell an update that changes nothing.
        current: {
          id: lesions.id, version: lesions.version, trackId: lesions.trackId, clockStartH: lesions.clockStartH, clockEndH: lesions.clockEndH,
          distanceStartCm: lesions.distanceStartCm, distanceEndCm: lesions.distanceEndCm, grade: lesions.grade, morphology: lesions.morphology,
          acetowhite: lesions.acetowhite, lugol: lesions.lugol, vessels: lesions.vessels, sizeMm: lesions.sizeMm, note: lesions.note,
        },
      })
      .from(visits)
      .innerJoin(sites, eq(sites.id, visits.siteId))
      .innerJoin(patients, eq(patients.id, visits.patientId))
      .leftJoin(lesions, opts.withLesion ? and(eq(lesions.id, dsql.placeholder("lesionId")), eq(lesions.visitId, visits.id)) : dsql`false`)
      .where(visitInScope)
      .limit(1);
    return opts.lockPatient ? base.for("update", { of: [visits, patients] }) : base.for("update", { of: visits });
  });
}
const lockForLesionStatements = {
  plain: lockForLesion({ lockPatient: false, withLesion: false }),
  patient: lockForLesion({ lockPatient: true, withLesion: false }),
  lesion: lockForLesion({ lockPatient: false, withLesion: true }),
  patientAndLesion: lockForLesion({ lockPatient: true, withLesion: true }),
};

/**
 * lockDraftVisit for lesion writes, in one statement: also the site's zone bounds, optionally the
 * patient row locked with the visit (track labels are numbered per patient), and optionally the
 * lesion being changed (null when it is not on this visit).
 */
export async function lockDraftVisitForLesion(tx: Tx, scope: SiteScope, visitId: string, opts: { lockPatient?: boolean; lesionId?: string } = {}) {
  const statement = opts.lockPatient
    ? opts.lesionId ? lockForLesionStatements.patientAndLesion : lockForLesionStatements.patient
    : opts.lesionId ? lockForLesionStatements.lesion : lockForLesionStatements.plain;
  const [row] = await statement(tx, { visitId, siteIds: siteIdsParam(scope), ...(opts.lesionId ? { lesionId: opts.lesionId } : {}) });
  if (!row) throw new AppError("not_found");
  if (row.visit.status === "signed") throw new AppError("locked");
  return { visit: row.visit, current: opts.lesionId ? row.current : null };
}
