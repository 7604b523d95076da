"use client";
import { Caution } from "@/components/ui/caution";
import { hsilExtent, type ExtentLesion } from "@/lib/tracking/hsil-extent";

/** Says on the map summary when HSIL or worse covers more than half of the circumference. */
export function HsilExtentNote({ lesions }: { lesions: readonly ExtentLesion[] }) {
  const { fraction, wide } = hsilExtent(lesions);
  if (!wide) return null;
  return (
    <Caution title={`HSIL or worse covers ${Math.round(fraction * 100)}% of the circumference (more than half)`}>
      Wide disease carried a higher risk of progression in a large trial and is usually treated in stages rather than in
      one session. Plan according to your local protocol; the clinician decides.
    </Caution>
  );
}
