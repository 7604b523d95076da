import "server-only";
import { db, type Db, type Tx } from "@/db/client";
import { codingRowsOfVisit, confirmedDiagnosesOfVisit, deleteDiagnosisRow, insertDiagnosis } from "@/db/queries/diagnoses";
import type { SiteScope } from "@/db/queries/scope";
import { AppError } from "@/lib/errors";
import { worstHistology } from "@/lib/tracking/histories";
import { codingCautions, suggestCodes, type CodingInput, type CodingLesion } from "@/lib/codes";
import { changeDraftVisit, readVisitPart } from "./visit-parts";

/**
 * The visit's findings in the shape lib/codes reads: each lesion with its worst histology
 * (and that biopsy's AIN grade and p16), plus biopsies taken away from any mapped lesion.
 */
async function codingInput(run: Db | Tx, visitId: string): Promise<CodingInput> {
  const { visit: v, lesions: lesionRows, biopsies: biopsyRows } = await codingRowsOfVisit(run, visitId);
  const coded: CodingLesion[] = lesionRows.map((l) => {
    const mine = biopsyRows.filter((b) => b.lesionId === l.id && b.histology);
    const worstResult = worstHistology(mine.map((b) => b.histology));
    const worst = mine.find((b) => b.histology === worstResult);
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

export function getDiagnoses(scope: SiteScope, visitId: string, ip: string) {
  return readVisitPart(scope, visitId, ip, "diagnoses", async (v) => {
    const [input, confirmed] = await Promise.all([codingInput(db, v.id), confirmedDiagnosesOfVisit(v.id)]);
    return { suggestions: suggestCodes(input), cautions: codingCautions(input), confirmed };
  });
}

/** Confirms a code only if this visit's findings still suggest it; the descriptor comes from lib/codes. */
export function confirmDiagnosis(scope: SiteScope, visitId: string, code: string, ip: string) {
  return changeDraftVisit(
    scope, visitId, ip,
    async (tx, v) => {
      const suggestion = suggestCodes(await codingInput(tx, v.id)).find((s) => s.code === code);
      if (!suggestion) throw new AppError("invalid", undefined, { code: ["This code is not suggested by the findings of this visit."] });
      await insertDiagnosis(tx, { visitId: v.id, siteId: v.siteId, code: suggestion.code, descriptor: suggestion.descriptor, confirmedBy: scope.userId });
      return { code: suggestion.code, why: suggestion.why };
    },
    (r, v) => ({ action: "diagnosis.confirm", entityType: "visit", entityId: v.id, detail: { code: r.code, why: r.why } }),
  );
}

export function unconfirmDiagnosis(scope: SiteScope, visitId: string, code: string, ip: string) {
  return changeDraftVisit(
    scope, visitId, ip,
    async (tx, v) => {
      if (!(await deleteDiagnosisRow(tx, v.id, code))) throw new AppError("not_found");
    },
    (_r, v) => ({ action: "diagnosis.unconfirm", entityType: "visit", entityId: v.id, detail: { code } }),
  );
}
