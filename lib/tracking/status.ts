// Status of one lesion track at each visit. Definitions:
// - persistent = disease in the same region as the treated index lesion at the next look,
//   metachronous = disease in a different region (Liu Y, Sigel K, Gaisa MM, Papillomavirus
//   Research 2018;5:S9);
// - resolution judged at follow-up after treatment, recurrence at later visits (Richel O et al.,
//   Lancet Oncol 2013;14:346-53);
// - "recurrent" = found again after a documented clear visit: common practice, no single source.
import { GRADE_TIER, type Grade, type Histology, type TrackStatus } from "@/lib/domain/vocab";
import { decideGrade, gradeWords, isDiseased } from "./effective-grade";

export interface TrackObservation {
  visitId: string;
  /** ISO date (YYYY-MM-DD); ISO strings sort in time order. */
  visitDate: string;
  /** How reasons name the visit; the date when absent. */
  visitLabel?: string;
  seen: boolean;
  impressionGrade?: Grade;
  histology?: Histology | null;
  treatedAtVisit: boolean;
  lookedFor: boolean;
  /** Disease at another track of this patient before this visit; overrides the track-level flag. */
  earlierDiseaseElsewhere?: boolean;
}

export interface TrackContext {
  /** The patient had disease at another track before this track first appeared. */
  earlierDiseaseElsewhere?: boolean;
}

export interface TrackVisitStatus {
  visitId: string;
  visitDate: string;
  status: TrackStatus | null;
  effectiveGrade: Grade | null;
  reason: string;
}

const nameOf = (o: TrackObservation) => o.visitLabel ?? o.visitDate;
const gradeOrUnknown = (g: Grade | null) => (g ? gradeWords(g) : "a lesion of unrecorded grade");

function compareStatus(now: Grade | null, before: Grade | null): "persistent" | "progressed" | "regressed" {
  // One tier per LAST grade: condyloma and LSIL are both low grade (GRADE_TIER).
  if (!now || !before || GRADE_TIER[now] === GRADE_TIER[before]) return "persistent";
  return GRADE_TIER[now] > GRADE_TIER[before] ? "progressed" : "regressed";
}

/** Returns one entry per observation, in date order (ties keep their given order). */
export function trackStatuses(observations: readonly TrackObservation[], context: TrackContext = {}): TrackVisitStatus[] {
  const visits = [...observations].sort((a, b) => (a.visitDate < b.visitDate ? -1 : a.visitDate > b.visitDate ? 1 : 0));
  let appeared = false;
  // The sighting later ones are compared with: the last diseased one, else the first sighting.
  let reference: { grade: Grade | null; name: string } | null = null;
  let treatedAt: string | null = null; // last treatment since the reference sighting
  let clearedAt: string | null = null; // first clear visit since that treatment
  let missedAt: string | null = null; // first untreated not-found visit since the reference

  return visits.map((o): TrackVisitStatus => {
    const out = (status: TrackStatus | null, effectiveGrade: Grade | null, reason: string): TrackVisitStatus => ({
      visitId: o.visitId,
      visitDate: o.visitDate,
      status,
      effectiveGrade,
      reason,
    });
    const at = nameOf(o);
    let result: TrackVisitStatus;

    if (!appeared) {
      if (!o.seen) return out(null, null, `not yet recorded at ${at}`);
      const d = decideGrade(o.impressionGrade, o.histology);
      const metachronous = o.earlierDiseaseElsewhere ?? context.earlierDiseaseElsewhere ?? false;
      appeared = true;
      reference = { grade: d.grade, name: at };
      result = out(
        "new",
        d.grade,
        `first recorded at ${at}: ${gradeOrUnknown(d.grade)} (${d.basis})` +
          // Liu 2018: disease in a different region from earlier disease is metachronous.
          (metachronous ? "; metachronous: new site after earlier disease elsewhere" : ""),
      );
    } else if (!o.seen && !o.lookedFor) {
      result = out(null, null, `site not examined at ${at}; no status`);
    } else {
      const ref = reference!;
      const d = o.seen ? decideGrade(o.impressionGrade, o.histology) : null;
      const looksClear = !d || (d.grade !== null && !isDiseased(d.grade));
      const what = d ? `${gradeOrUnknown(d.grade)} (${d.basis})` : "not found";
      const since = `${gradeOrUnknown(ref.grade)} at ${ref.name}`;
      const afterTreatment =
        treatedAt === ref.name
          ? `treatment of ${since}`
          : `treatment at ${treatedAt} (last seen: ${since})`;

      if (looksClear) {
        // Our choice: a benign finding counts as clear, e.g. treated HSIL whose follow-up biopsy is
        // benign is cleared, not regressed or persistent.
        if (treatedAt) {
          clearedAt ??= at;
          result = out("cleared", d?.grade ?? null, `${what} at ${at} after ${afterTreatment}`);
        } else if (ref.grade === null || isDiseased(ref.grade)) {
          missedAt ??= at;
          result = out("regressed", d?.grade ?? null, `${what} at ${at}, untreated since ${since}`);
        } else if (d) {
          result = out("persistent", d.grade, `${what} at ${at}, benign as at ${ref.name}`);
        } else {
          result = out("regressed", null, `not found at ${at}, untreated; benign at ${ref.name}`);
        }
      } else {
        const grade = d!.grade;
        let status: TrackStatus;
        let reason: string;
        if (clearedAt) {
          status = "recurrent";
          reason = `${what} found again at ${at} after the site was clear at ${clearedAt} following ${afterTreatment}`;
        } else {
          // Liu 2018: found at the first look after treatment = persistent (higher grade: progressed).
          status = compareStatus(grade, ref.grade);
          // Disease still at the treated site at a lower tier is not untreated regression: it stays
          // "persistent" (Liu 2018 counts disease at the treated site at the first look as
          // persistence), and the reason names the lower grade. "regressed" is kept for untreated sites.
          const lowerAfterTreatment = treatedAt !== null && status === "regressed";
          if (lowerAfterTreatment) status = "persistent";
          const situation = treatedAt
            ? `first look after ${afterTreatment}${lowerAfterTreatment ? `; persistent at a lower grade than the ${gradeOrUnknown(ref.grade)} treated` : ""}`
            : missedAt
              ? `untreated; not found at ${missedAt}, counted as missed; before that ${since}`
              : `untreated since ${since}`;
          reason = `${what} at ${at}, ${situation}`;
        }
        result = out(status, grade, reason);
        reference = { grade: grade ?? ref.grade, name: at };
        treatedAt = null;
        clearedAt = null;
        missedAt = null;
      }
    }

    if (o.treatedAtVisit) {
      treatedAt = at;
      clearedAt = null; // only a clear visit after the latest treatment makes a later finding recurrent
      missedAt = null;
    }
    return result;
  });
}
