"use client";
// The clock numbering of one visit page, shared by the map, the lesion table and form, the
// biopsy form and the treatment arcs, so every clock number on the page reads the same way.
// It opens in the position the patient was examined in: a map drawn in another numbering than
// the one the examiner saw invites a half-turn error. The user can switch; the data never changes.
import { createContext, useContext, useState, type ReactNode } from "react";
import type { DisplayConvention } from "@/lib/geometry";
import { CONVENTION_LABEL } from "@/components/canal-map";

export const NUMBERING_WORDS: Record<DisplayConvention, string> = {
  lithotomy: "lithotomy",
  prone_jackknife: "prone jack-knife",
  left_lateral: "left lateral",
};

export interface Numbering {
  conv: DisplayConvention;
  setConv: (c: DisplayConvention) => void;
  /** The position of the examination, when known. */
  position: DisplayConvention | null;
}

const NumberingContext = createContext<Numbering | null>(null);

export function VisitNumbering({ position, children }: { position: DisplayConvention; children: ReactNode }) {
  const [conv, setConv] = useState<DisplayConvention>(position);
  return <NumberingContext.Provider value={{ conv, setConv, position }}>{children}</NumberingContext.Provider>;
}

/** The page's numbering; outside a visit page, a local one that opens in `fallback`. */
export function useNumbering(fallback: DisplayConvention, position: DisplayConvention | null = null): Numbering {
  const shared = useContext(NumberingContext);
  const [chosen, setChosen] = useState<DisplayConvention | null>(null);
  return shared ?? { conv: chosen ?? position ?? fallback, setConv: setChosen, position };
}

/** "(lithotomy numbering)": said beside every clock field. */
export function numberingSuffix(conv: DisplayConvention): string {
  return `${NUMBERING_WORDS[conv]} numbering`;
}

/** Which numbering is shown, and a caution when it is not the position the patient was examined in. */
export function NumberingNote({ position, conv }: { position: DisplayConvention; conv: DisplayConvention }) {
  if (position === conv) {
    return <p className="text-sm font-semibold" data-numbering={conv}>Numbered as examined: {CONVENTION_LABEL[conv].toLowerCase()}</p>;
  }
  return (
    <p role="status" className="rounded-md border-2 border-caution-rule bg-caution-bg px-3 py-1 text-sm font-semibold text-caution-ink" data-numbering={conv}>
      Shown in {CONVENTION_LABEL[conv].toLowerCase()} numbering; the patient was examined {CONVENTION_LABEL[position].toLowerCase()}. Clock numbers differ from the examination.
    </p>
  );
}
