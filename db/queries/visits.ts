import "server-only";
import { and, eq } from "drizzle-orm";
import type { Tx } from "../client";
import { patients, visits } from "../schema";
import { inScope, type SiteScope } from "./scope";

export async function patientSiteInScope(tx: Tx, scope: SiteScope, patientId: string) {
  const [patient] = await tx.select({ id: patients.id, siteId: patients.siteId, dateOfBirth: patients.dateOfBirth }).from(patients).where(and(eq(patients.id, patientId), inScope(patients.siteId, scope))).limit(1);
  return patient ?? null;
}

export async function insertVisit(tx: Tx, values: typeof visits.$inferInsert) {
  const [visit] = await tx.insert(visits).values(values).returning({ id: visits.id, visitDate: visits.visitDate, status: visits.status, version: visits.version });
  return visit!;
}
