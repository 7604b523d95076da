// The reason behind the treated-extent caution, in a module of its own: the follow-up summary on
// the map page shows it too, and importing it from the treatments panel brought that whole panel
// (a lazily loaded one) into the map page's first load.

/** Why the caution exists and who decides, said every time it shows. */
export function ExtentWhy({ cautionFraction }: { cautionFraction: number }) {
  return (
    <p>Staged treatment is planned for circumferential disease because of the risk of narrowing (Pineda CE et al., J Gastrointest Surg 2007).
      This clinic&apos;s caution level is {Math.round(cautionFraction * 100)}% of the circumference, a figure set per site; your local protocol and the treating clinician decide.</p>
  );
}
