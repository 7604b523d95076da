import { z } from "zod";
import { text } from "@/lib/validation/text";
import { MODALITIES } from "@/lib/domain/vocab";
import { clockEndH, clockStartH, endOf12IsWholeCircle, FULL_CIRCLE_ONLY_MESSAGE } from "@/lib/validation/clock";
import { assessDoses, assessExtent, dailyTotals, doseEntrySchema, type DoseAssessment, type DoseEntry, type ExtentAssessment } from "@/lib/dosing";
import { overlapH, type Arc } from "@/lib/geometry/arcs";
import { arcCoverage } from "@/lib/geometry/coverage";
import type { Grade } from "@/lib/domain/vocab";

// Treatment and local-anaesthetic forms, shared by the client and the routes, plus the two
// gates the server applies before it stores an entry. Pure: the routes pass in what the
// database holds; nothing here trusts a figure computed by the client.

const TOPICAL = new Set(["topical_imiquimod", "topical_fluorouracil", "topical_cidofovir"]);
export const isTopical = (m: string) => TOPICAL.has(m);

/** A clockwise arc in the stored (lithotomy) frame; the whole circumference is 0 → 12. */
export const treatedArcSchema = z
  .object({ startH: clockStartH, endH: clockEndH })
  .refine((a) => Math.abs(a.startH - a.endH) > 1e-9, { message: "An arc must cover part of the circumference: start and end differ.", path: ["endH"] })
  .refine((a) => endOf12IsWholeCircle(a.startH, a.endH), { message: FULL_CIRCLE_ONLY_MESSAGE, path: ["endH"] });

const reason = (what: string) => text().trim().min(3, `Give the reason for ${what} (at least 3 characters).`).max(1000, "Keep the reason under 1,000 characters.");

export const treatmentSchema = z
  .object({
    lesionId: text().uuid("Not a lesion of this visit.").nullable().optional(),
    modality: z.enum(MODALITIES, { message: "Choose how the area was treated." }),
    regimen: text().trim().max(500, "Keep the regimen under 500 characters.").nullable().optional(),
    arcs: z.array(treatedArcSchema).max(12, "At most 12 arcs per treatment."),
    extentOverrideReason: reason("treating this much of the circumference").nullable().optional(),
    cancerOverrideReason: reason("treating a lesion that may be cancer").nullable().optional(),
    note: text().trim().max(2000, "Keep the note under 2,000 characters.").nullable().optional(),
    // The clinician's answer for each lesion the arcs reach only in part: treated or not.
    partialCover: z
      .array(z.object({ lesionId: text().uuid("Not a lesion of this visit."), treated: z.boolean({ message: "Say whether the lesion was treated." }) }))
      .max(200, "Too many lesions.")
      .optional(),
  })
  .refine((t) => !isTopical(t.modality) || (t.regimen ?? "").length > 0, { message: "Write the regimen for a topical agent (what, how often, how long).", path: ["regimen"] })
  .refine((t) => isTopical(t.modality) || t.arcs.length > 0 || !!t.lesionId, { message: "Name the lesion treated or enter at least one treated arc.", path: ["arcs"] });
export type TreatmentInput = z.infer<typeof treatmentSchema>;

export const anaestheticSchema = doseEntrySchema.extend({
  overrideReason: reason("going over the maximum").nullable().optional(),
});
export type AnaestheticInput = z.infer<typeof anaestheticSchema>;

export interface DoseGate {
  before: DoseAssessment;
  after: DoseAssessment;
  /** The new entry leaves some agent, or the combined share, over its maximum. */
  over: boolean;
  /** Some total is at or above the warning share (80 %) but none is over. */
  near: boolean;
  message: string;
}

function mg(n: number) {
  return `${Math.round(n * 10) / 10} mg`;
}

/** What the visit's running totals become if `added` is stored; the server refuses `over` without a reason. */
export function gateDose(
  existing: readonly DoseEntry[],
  added: DoseEntry,
  weightKg?: number | null,
  /** The patient's doses at other sessions in the 24 hours before this one. */
  earlierWithin24h: readonly DoseEntry[] = [],
): DoseGate {
  const w = weightKg ?? undefined;
  const before = assessDoses(existing, w);
  const after = assessDoses([...existing, added], w);
  const overAgents = after.agents.filter((a) => a.level === "over");
  const overDaily = dailyTotals(earlierWithin24h, [...existing, added]).filter((d) => d.over && d.agent === added.agent);
  const over = overAgents.length > 0 || after.combined.level === "over" || overDaily.length > 0;
  const near = !over && (after.agents.some((a) => a.level === "near") || after.combined.level === "near");
  let message = "Within the maximum.";
  if (overAgents.length) {
    message = overAgents.map((a) => `This brings ${a.agent} to ${mg(a.totalMg)}, over the maximum of ${mg(a.maxMg)}. ${a.explanation}`).join(" ");
  } else if (overDaily.length) {
    message = overDaily
      .map((d) => `This brings ${d.agent} to ${mg(d.totalMg)} in 24 hours (${mg(d.earlierMg)} at earlier sessions), over the daily maximum of ${mg(d.limitMg)} on the product label.`)
      .join(" ");
  } else if (over) {
    message = `Each agent is under its own maximum, but together they reach ${Math.round(after.combined.fraction * 100)}% of the combined allowance (local anaesthetic toxicity adds up).`;
  } else if (near) {
    message = "The running total is close to the maximum (80% or more).";
  }
  return { before, after, over, near, message };
}

export interface ExtentGate {
  assessment: ExtentAssessment;
  /** The visit's treated union reaches the caution level with this treatment's arcs added. */
  needsReason: boolean;
}

/** The union of all the visit's treated arcs with the new ones, against the site's caution level. */
export function gateExtent(existingArcs: readonly Arc[], addedArcs: readonly Arc[], cautionFraction: number): ExtentGate {
  const assessment = assessExtent([...existingArcs, ...addedArcs], cautionFraction);
  return { assessment, needsReason: addedArcs.length > 0 && assessment.level === "caution" };
}

export interface LesionRisk { id: string; label: string; startH: number; endH: number; grade: Grade | null; carcinomaOnHistology: boolean }

/**
 * Lesions suspected or proven to be cancer that this treatment reaches: the named lesion, or any
 * lesion whose clock extent a treated arc overlaps. A topical agent ablates nothing and is left out.
 * Ablating a possible cancer destroys the tissue that diagnosis and staging need and can delay
 * referral (common practice, no source), so the server wants a recorded reason for it.
 */
export function cancerLesionsReached(lesions: readonly LesionRisk[], lesionId: string | null | undefined, arcs: readonly Arc[], modality: string): LesionRisk[] {
  if (isTopical(modality)) return [];
  return lesions.filter((l) =>
    (l.grade === "suspected_cancer" || l.carcinomaOnHistology) &&
    (l.id === lesionId || arcs.some((a) => overlapH(a, { startH: l.startH, endH: l.endH }) > 0)));
}

/** The caution shown before such a treatment is stored, naming each lesion and why. */
export function cancerCautionMessage(reached: readonly LesionRisk[]): string {
  const each = reached.map((l) => `lesion ${l.label} ${l.carcinomaOnHistology ? "shows squamous cell carcinoma on histology" : "is graded suspected cancer"}`);
  return `This treatment reaches ${each.join(" and ")}. Ablating a possible cancer can destroy the tissue needed for diagnosis and staging and delay referral; the usual course is histological confirmation and referral. Your local protocol and the treating clinician decide.`;
}

export interface LesionExtent { id: string; label: string; startH: number; endH: number }

/** The visit's lesions other than the named one that the arcs cover fully, and those they reach in part. */
export function lesionsReachedByArcs<L extends LesionExtent>(lesions: readonly L[], lesionId: string | null | undefined, arcs: readonly Arc[]): { full: L[]; partial: L[] } {
  const full: L[] = [];
  const partial: L[] = [];
  for (const l of lesions) {
    if (l.id === lesionId) continue;
    const c = arcCoverage({ startH: l.startH, endH: l.endH }, arcs);
    if (c === "full") full.push(l);
    else if (c === "partial") partial.push(l);
  }
  return { full, partial };
}

/**
 * The lesions a treatment treats, as stored with it and read by the track statuses: the named
 * lesion, each lesion whose clock extent the arcs cover fully, and each lesion they cover in part
 * that the clinician said was treated. `undecided`: lesions reached in part with no answer yet
 * (the server asks before it stores anything).
 */
export function treatedLesions<L extends LesionExtent>(
  lesions: readonly L[],
  lesionId: string | null | undefined,
  arcs: readonly Arc[],
  decisions: readonly { lesionId: string; treated: boolean }[] = [],
): { ids: string[]; undecided: L[] } {
  const { full, partial } = lesionsReachedByArcs(lesions, lesionId, arcs);
  const answer = new Map(decisions.map((d) => [d.lesionId, d.treated]));
  const ids = [...(lesionId ? [lesionId] : []), ...full.map((l) => l.id), ...partial.filter((l) => answer.get(l.id) === true).map((l) => l.id)];
  return { ids, undecided: partial.filter((l) => !answer.has(l.id)) };
}

/** The question put to the clinician about lesions the arcs reach only in part. */
export function partialCoverMessage(undecided: readonly LesionExtent[]): string {
  const labels = undecided.map((l) => l.label).join(", ");
  return `The treated arcs reach ${undecided.length === 1 ? "lesion" : "lesions"} ${labels} only in part. Say for each whether it was treated (it then counts as treated for follow-up).`;
}
