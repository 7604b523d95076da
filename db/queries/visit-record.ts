import "server-only";
import { and, eq, sql as dsql } from "drizzle-orm";
import { alias } from "drizzle-orm/pg-core";
import { db, prepared, type Db, type Tx } from "../client";
import { sites, users, visits } from "../schema";
import { inScopeParam, siteIdsParam, type SiteScope } from "./scope";
import { AppError } from "@/lib/errors";
import { DEFAULT_CAUTION_FRACTION } from "@/lib/dosing";
import type { VisitRecord } from "@/lib/api/types";

const examiner = alias(users, "examiner");
const signer = alias(users, "signer");

/** The visit header with every exam field, the examiner's and signer's names and the site's caution level. */
export function getVisitRecord(scope: SiteScope, visitId: string) {
  return readVisitRecord(db, scope, visitId);
}

// Built once: every visit screen and every exam save reads it.
const visitRecord = prepared((run) =>
  run
    .select({
      id: visits.id,
      patientId: visits.patientId,
      siteId: visits.siteId,
      visitDate: visits.visitDate,
      status: visits.status,
      examinerId: visits.examinerId,
      examinerName: examiner.displayName,
      patientPosition: visits.patientPosition,
      indication: visits.indication,
      cytology: visits.cytology,
      hpvResult: visits.hpvResult,
      adequacy: visits.adequacy,
      examStartedAt: visits.examStartedAt,
      examEndedAt: visits.examEndedAt,
      anaesthesia: visits.anaesthesia,
      patientWeightKg: visits.patientWeightKg,
      plan: visits.plan,
      signedAt: visits.signedAt,
      signedByName: signer.displayName,
      version: visits.version,
      updatedAt: visits.updatedAt,
      extentCautionFraction: sites.extentCautionFraction,
    })
    .from(visits)
    .innerJoin(examiner, eq(examiner.id, visits.examinerId))
    .innerJoin(sites, eq(sites.id, visits.siteId))
    .leftJoin(signer, eq(signer.id, visits.signedBy))
    .where(and(eq(visits.id, dsql.placeholder("visitId")), inScopeParam(visits.siteId)))
    .limit(1),
);

export async function readVisitRecord(run: Db | Tx, scope: SiteScope, visitId: string): Promise<VisitRecord> {
  const [row] = await visitRecord(run, { visitId, siteIds: siteIdsParam(scope) });
  if (!row) throw new AppError("not_found");
  return { ...row, extentCautionFraction: row.extentCautionFraction ?? DEFAULT_CAUTION_FRACTION };
}
export type { VisitRecord };

// A value bound as is (dates go in as ISO text, as drizzle would send them).
const p = (name: string) => dsql`${dsql.placeholder(name)}`;
// Built once: the exam form saves every field each time.
export const saveExam = prepared((run) =>
  run
    .update(visits)
    .set({
      visitDate: p("visitDate"),
      patientPosition: p("patientPosition"),
      indication: p("indication"),
      cytology: p("cytology"),
      hpvResult: p("hpvResult"),
      adequacy: p("adequacy"),
      examStartedAt: p("examStartedAt"),
      examEndedAt: p("examEndedAt"),
      anaesthesia: p("anaesthesia"),
      patientWeightKg: p("patientWeightKg"),
      plan: p("plan"),
      version: p("version"),
      updatedAt: p("updatedAt"),
    })
    .where(eq(visits.id, dsql.placeholder("id")))
    .returning({ version: visits.version }),
);

