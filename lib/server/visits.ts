import "server-only";
import { db } from "@/db/client";
import { insertVisit, patientSiteInScope } from "@/db/queries/visits";
import { recordAudit } from "@/db/queries/audit-write";
import type { SiteScope } from "@/db/queries/scope";
import { AppError } from "@/lib/errors";
import type { CreateVisitInput } from "@/lib/validation/visits";
import { careDayProblem } from "@/lib/validation/dates";

/** A new draft visit examined by the caller; audited with it. */
export async function createVisit(scope: SiteScope, patientId: string, input: CreateVisitInput, ip: string) {
  return db.transaction(async (tx) => {
    const patient = await patientSiteInScope(tx, scope, patientId);
    if (!patient) throw new AppError("not_found");
    const problem = careDayProblem(input.visitDate, { birthDate: patient.dateOfBirth });
    if (problem) throw new AppError("invalid", undefined, { visitDate: [problem] });
    const visit = await insertVisit(tx, {
      patientId: patient.id,
      siteId: patient.siteId,
      visitDate: input.visitDate,
      examinerId: scope.userId,
      patientPosition: input.patientPosition,
      indication: input.indication,
    });
    await recordAudit({ userId: scope.userId, siteId: patient.siteId, patientId, action: "visit.create", entityType: "visit", entityId: visit.id, ip }, tx);
    return { ...visit, siteId: patient.siteId, patientId: patient.id };
  });
}
