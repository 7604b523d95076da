import "server-only";
import { and, asc, eq } from "drizzle-orm";
import { db, type Db, type Tx } from "../client";
import { biopsies, lesions, users, visitDiagnoses, visits } from "../schema";
import { loadVisit, lockDraftVisit } from "./visit-access";
import type { SiteScope } from "./scope";
import { AppError } from "@/lib/errors";
import { HISTOLOGY, type Histology } from "@/lib/domain/vocab";
import { codingCautions, suggestCodes, type CodingInput, type CodingLesion } from "@/lib/codes";

const RANK = Object.fromEntries(HISTOLOGY.map((h, i) => [h, i])) as Record<Histology, number>;

/**
 * The visit's findings in the shape lib/codes reads: each lesion with its worst histology
 * (and that biopsy's AIN grade and p16), plus biopsies taken away from any mapped lesion.
 */
async function codingInput(run: Db | Tx, visitId: string): Promise<CodingInput> {
  const [v] = await run.select({ cytology: visits.cytology, hpv: visits.hpvResult }).from(visits).where(eq(visits.id, visitId)).limit(1);
  const lesionRows = await run
    .select({ id: lesions.id, grade: lesions.grade, distanceStartCm: lesions.distanceStartCm, distanceEndCm: lesions.distanceEndCm })
    .from(lesions)
    .where(eq(lesions.visitId, visitId));
  const biopsyRows = await run
    .select({ lesionId: biopsies.lesionId, histology: biopsies.histology, ain: biopsies.ainGrade, p16: biopsies.p16, distanceCm: biopsies.distanceCm })
    .from(biopsies)
    .where(eq(biopsies.visitId, visitId));
  const coded: CodingLesion[] = lesionRows.map((l) => {
    const worst = biopsyRows
      .filter((b) => b.lesionId === l.id && b.histology)
      .sort((a, b) => RANK[b.histology!] - RANK[a.histology!])[0];
    return {
      grade: l.grade,
      distanceStartCm: l.distanceStartCm,
      distanceEndCm: l.distanceEndCm,
      histology: worst?.histology ?? undefined,
      ain: worst?.ain ?? undefined,
      p16: worst?.p16 ?? undefined,
    };
  });
  for (const b of biopsyRows) {
    if (b.lesionId || !b.histology) continue;
    // A biopsy of an unmapped spot carries no impression grade; its histology alone is coded.
    coded.push({ grade: "benign", histology: b.histology, ain: b.ain ?? undefined, p16: b.p16 ?? undefined, distanceStartCm: b.distanceCm });
  }
  return { lesions: coded, cytology: v?.cytology, hpv: v?.hpv };
}

export async function getDiagnoses(scope: SiteScope, visitId: string) {
  const v = await loadVisit(db, scope, visitId);
  const input = await codingInput(db, v.id);
  const confirmed = await db
    .select({ code: visitDiagnoses.code, descriptor: visitDiagnoses.descriptor, confirmedAt: visitDiagnoses.confirmedAt, confirmedByName: users.displayName })
    .from(visitDiagnoses)
    .innerJoin(users, eq(users.id, visitDiagnoses.confirmedBy))
    .where(eq(visitDiagnoses.visitId, v.id))
    .orderBy(asc(visitDiagnoses.code));
  return { visit: v, suggestions: suggestCodes(input), cautions: codingCautions(input), confirmed };
}

/** Confirms a code only if this visit's findings still suggest it; the descriptor comes from lib/codes. */
export async function confirmDiagnosis(scope: SiteScope, userId: string, visitId: string, code: string) {
  return db.transaction(async (tx) => {
    const v = await lockDraftVisit(tx, scope, visitId);
    const suggestion = suggestCodes(await codingInput(tx, v.id)).find((s) => s.code === code);
    if (!suggestion) throw new AppError("invalid", undefined, { code: ["This code is not suggested by the findings of this visit."] });
    await tx.insert(visitDiagnoses).values({ visitId: v.id, siteId: v.siteId, code: suggestion.code, descriptor: suggestion.descriptor, confirmedBy: userId }).onConflictDoNothing();
    return { visit: v, code: suggestion.code, why: suggestion.why };
  });
}

export async function unconfirmDiagnosis(scope: SiteScope, visitId: string, code: string) {
  return db.transaction(async (tx) => {
    const v = await lockDraftVisit(tx, scope, visitId);
    const gone = await tx.delete(visitDiagnoses).where(and(eq(visitDiagnoses.visitId, v.id), eq(visitDiagnoses.code, code))).returning({ id: visitDiagnoses.id });
    if (!gone.length) throw new AppError("not_found");
    return { visit: v };
  });
}
