import "server-only";
import { and, eq, sql as dsql } from "drizzle-orm";
import { lesions, patients, sites, visits } from "../schema";
import type { Db, Tx } from "../client";
import { inScope, type SiteScope } from "./scope";
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

export type VisitHeader = Awaited<ReturnType<typeof loadVisit>>;

/** A visit the caller's sites may see, or not_found. */
export async function loadVisit(run: Db | Tx, scope: SiteScope, visitId: string) {
  const [v] = await run.select(visitColumns).from(visits).where(and(eq(visits.id, visitId), inScope(visits.siteId, scope))).limit(1);
  if (!v) throw new AppError("not_found");
  return v;
}

/**
 * Inside a transaction: locks the visit row so concurrent writers queue, and refuses a signed
 * visit (423: changes to a signed visit go in an addendum).
 */
export async function lockDraftVisit(tx: Tx, scope: SiteScope, visitId: string) {
  const [v] = await tx
    .select(visitColumns)
    .from(visits)
    .where(and(eq(visits.id, visitId), inScope(visits.siteId, scope)))
    .for("update")
    .limit(1);
  if (!v) throw new AppError("not_found");
  if (v.status === "signed") throw new AppError("locked");
  return v;
}

/**
 * lockDraftVisit for lesion writes, in one statement: also the site's zone bounds, optionally the
 * patient row locked with the visit (track labels are numbered per patient), and optionally the
 * lesion being changed (null when it is not on this visit).
 */
export async function lockDraftVisitForLesion(tx: Tx, scope: SiteScope, visitId: string, opts: { lockPatient?: boolean; lesionId?: string } = {}) {
  const base = tx
    .select({
      visit: { ...visitColumns, zoneBounds: sites.zoneBounds },
      current: { id: lesions.id, version: lesions.version, distanceStartCm: lesions.distanceStartCm, distanceEndCm: lesions.distanceEndCm },
    })
    .from(visits)
    .innerJoin(sites, eq(sites.id, visits.siteId))
    .innerJoin(patients, eq(patients.id, visits.patientId))
    .leftJoin(lesions, opts.lesionId ? and(eq(lesions.id, opts.lesionId), eq(lesions.visitId, visits.id)) : dsql`false`)
    .where(and(eq(visits.id, visitId), inScope(visits.siteId, scope)))
    .limit(1);
  const [row] = await (opts.lockPatient ? base.for("update", { of: [visits, patients] }) : base.for("update", { of: visits }));
  if (!row) throw new AppError("not_found");
  if (row.visit.status === "signed") throw new AppError("locked");
  return { visit: row.visit, current: opts.lesionId ? row.current : null };
}
