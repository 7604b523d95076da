import "server-only";
import { and, eq } from "drizzle-orm";
import { db } from "../client";
import { patients, visits } from "../schema";
import { inScope, type SiteScope } from "./scope";
import type { CreateVisitInput } from "@/lib/validation/visits";

export async function createVisit(scope: SiteScope, patientId: string, input: CreateVisitInput) {
  return db.transaction(async (tx) => {
    const [patient] = await tx
      .select({ id: patients.id, siteId: patients.siteId })
      .from(patients)
      .where(and(eq(patients.id, patientId), inScope(patients.siteId, scope)))
      .limit(1);
    if (!patient) return null;
    const [visit] = await tx
      .insert(visits)
      .values({
        patientId: patient.id,
        siteId: patient.siteId,
        visitDate: input.visitDate,
        examinerId: scope.userId,
        patientPosition: input.patientPosition,
        indication: input.indication,
      })
      .returning({ id: visits.id, visitDate: visits.visitDate, status: visits.status, version: visits.version });
    return { ...visit, siteId: patient.siteId, patientId: patient.id };
  });
}
