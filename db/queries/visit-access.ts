import "server-only";
import { and, eq } from "drizzle-orm";
import { visits } from "../schema";
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
