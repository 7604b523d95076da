"use client";
import { lesionsReachedByArcs, type LesionExtent } from "@/lib/validation/treatments";
import type { Arc } from "@/lib/geometry";

/**
 * Which of the visit's lesions the treated arcs reach: those covered fully count as treated for
 * follow-up; for each one reached only in part the clinician says whether it was treated. The
 * server applies the same rule (lib/geometry/coverage.ts) and stores the answer with the treatment.
 */
export function LesionCoverage({ lesions, lesionId, arcs, answers, onAnswer, error }: {
  lesions: readonly LesionExtent[];
  lesionId: string | null;
  arcs: readonly Arc[];
  answers: Record<string, boolean>;
  onAnswer: (lesionId: string, treated: boolean) => void;
  error?: string;
}) {
  const { full, partial } = lesionsReachedByArcs(lesions, lesionId, arcs);
  if (!full.length && !partial.length && !error) return null;
  return (
    <fieldset className="flex flex-col gap-2 rounded-md border border-rule px-3 py-2">
      <legend className="px-1 text-sm font-semibold">Lesions these arcs reach</legend>
      {full.length ? <p className="text-sm">Covered fully, counted as treated: lesion {full.map((l) => l.label).join(", ")}.</p> : null}
      {partial.map((l) => (
        <div key={l.id} role="radiogroup" aria-label={`Lesion ${l.label}, reached in part: treated?`} className="flex flex-wrap items-center gap-3 text-sm">
          <span>Lesion {l.label} is reached only in part. Was it treated?</span>
          <label className="inline-flex min-h-11 items-center gap-2">
            <input type="radio" className="size-5" name={`cover-${l.id}`} checked={answers[l.id] === true} onChange={() => onAnswer(l.id, true)} />
            Yes, treated
          </label>
          <label className="inline-flex min-h-11 items-center gap-2">
            <input type="radio" className="size-5" name={`cover-${l.id}`} checked={answers[l.id] === false} onChange={() => onAnswer(l.id, false)} />
            No, not treated
          </label>
        </div>
      ))}
      {error ? <p className="text-sm font-semibold text-danger-ink">✕ {error}</p> : null}
    </fieldset>
  );
}

/** The answers the server wants: one per lesion now reached in part (stale answers dropped). */
export function partialCoverAnswers(lesions: readonly LesionExtent[], lesionId: string | null, arcs: readonly Arc[], answers: Record<string, boolean>) {
  return lesionsReachedByArcs(lesions, lesionId, arcs).partial.filter((l) => l.id in answers).map((l) => ({ lesionId: l.id, treated: answers[l.id]! }));
}
