// Dentate's map encoding, written down once. The map (lesion-shape.tsx, patterns.tsx) and the
// legend (map-legend.tsx) both read it, so they cannot drift apart. Every grade carries a fill
// pattern AND an outline AND a hue, so a greyscale print or a colour-blind reader loses nothing.
import { GRADE_LABEL, type Grade, type Zone } from "@/lib/domain/vocab";

// Fills are parallel lines only: dots and grids are how the trade draws punctation and mosaic,
// which Dentate records separately as vessel findings, so no grade may look like them.
export type FillPattern = "open" | "bands" | "hatch" | "bars" | "solid";

/** A line texture: parallel lines at an angle (0 = horizontal), their spacing and width in viewBox units. */
export interface LineTexture {
  angleDeg: number;
  spacing: number;
  width: number;
}

export interface GradeEncoding {
  grade: Grade;
  label: string;
  /** CSS colour tokens from app/globals.css. */
  hue: string;
  strokeHue: string;
  pattern: FillPattern;
  /** The lines of a line fill (bands, hatch, bars); none for open and solid. */
  lines?: LineTexture;
  /** Outline: dash array (undefined = continuous) and width in viewBox units. */
  outlineDash?: string;
  outlineWidth: number;
  /** Two concentric outlines: reserved for the loudest grade. */
  doubleOutline: boolean;
  /** What the pattern looks like, in words, for the legend and for print readers. */
  words: string;
}

export const GRADE_ENCODING: Record<Grade, GradeEncoding> = {
  benign: {
    grade: "benign",
    label: GRADE_LABEL.benign,
    hue: "var(--color-grade-benign)",
    strokeHue: "var(--color-grade-benign-stroke)",
    pattern: "open",
    outlineDash: "1.5 4",
    outlineWidth: 2.2,
    doubleOutline: false,
    words: "open, dotted outline",
  },
  condyloma: {
    grade: "condyloma",
    label: GRADE_LABEL.condyloma,
    hue: "var(--color-grade-condyloma)",
    strokeHue: "var(--color-grade-condyloma-stroke)",
    pattern: "bands",
    lines: { angleDeg: 0, spacing: 7, width: 1.4 },
    outlineWidth: 1.6,
    doubleOutline: false,
    words: "thin horizontal bands, thin outline",
  },
  lsil: {
    grade: "lsil",
    label: GRADE_LABEL.lsil,
    hue: "var(--color-grade-lsil)",
    strokeHue: "var(--color-grade-lsil-stroke)",
    pattern: "hatch",
    lines: { angleDeg: 45, spacing: 10, width: 2 },
    outlineWidth: 2,
    doubleOutline: false,
    words: "sparse single diagonal lines",
  },
  hsil: {
    grade: "hsil",
    label: GRADE_LABEL.hsil,
    hue: "var(--color-grade-hsil)",
    strokeHue: "var(--color-grade-hsil-stroke)",
    pattern: "bars",
    lines: { angleDeg: -45, spacing: 6, width: 3.2 },
    outlineWidth: 2.6,
    doubleOutline: false,
    words: "heavy diagonal bars, heavy outline",
  },
  suspected_cancer: {
    grade: "suspected_cancer",
    label: GRADE_LABEL.suspected_cancer,
    hue: "var(--color-grade-cancer)",
    strokeHue: "var(--color-grade-cancer-stroke)",
    pattern: "solid",
    outlineWidth: 6,
    doubleOutline: true,
    words: "solid dark fill, double outline",
  },
};

/** Treated: a dashed halo just outside the lesion and a small ringed-dot mark at its outer edge. */
export const TREATED_MARK = { haloPx: 6, dash: "6 4", strokeWidth: 2, markRadius: 6, words: "dashed halo with a ringed dot" } as const;
/** Biopsied: a square tag carrying the specimen letter(s), as on the requisition. */
export const BIOPSY_TAG = { size: 18, words: "square tag with the specimen letter" } as const;
/** Previous visit's lesions: faint, dashed, labelled with their track. */
export const GHOST_MARK = { dash: "5 5", opacity: 0.6, strokeWidth: 2, words: "faint dashed outline with its track label" } as const;
/**
 * Treated arcs of this visit: a band just outside the verge ring, drawn as radial rungs between
 * two thin rails (a "ladder"). No grade uses rungs or rails, so it reads in greyscale too.
 */
export const TREATED_RING = { innerGapPx: 3, widthPx: 12, rung: "2.5 3", rail: 1.4, stroke: "var(--color-ink)", words: "ladder band just outside the verge: treated arc this visit" } as const;
/** Selected lesion: a thick ring in the interface colour, with handles when editable. */
export const SELECTION_RING = { stroke: "var(--color-lagoon-600)", width: 4, padPx: 4 } as const;
/** A lesion whose save failed: a thick broken outline in the danger colour and a "!" badge. */
export const UNSAVED_MARK = { stroke: "var(--color-danger-ink)", dash: "10 5", width: 3, words: "red broken outline and ! badge: not saved" } as const;

/** The two landmark rings, on the screen and in print: a heavy continuous verge, a dash-dot dentate line. */
export const VERGE_RING = { width: 4, words: "heavy ring: anal verge" } as const;
export const DENTATE_RING = { width: 2, dash: "12 4 2 4", words: "dash-dot ring: dentate line" } as const;

export const ZONE_ENCODING: ReadonlyArray<{ zone: Zone; label: string; fill: string }> = [
  { zone: "perianal", label: "Perianal skin (outside the verge)", fill: "var(--color-zone-perianal)" },
  { zone: "distal_canal", label: "Distal canal", fill: "var(--color-zone-distal)" },
  { zone: "transformation_zone", label: "Transformation zone", fill: "var(--color-zone-tz)" },
  { zone: "proximal_canal", label: "Proximal canal", fill: "var(--color-zone-proximal)" },
  { zone: "distal_rectum", label: "Distal rectum", fill: "var(--color-zone-rectum)" },
];

export const ORIENTATION_NOTE = `Looking into the canal: the centre is the deepest point (distal rectum), the outer ring is the perianal skin. The ${VERGE_RING.words.replace(": ", " is the ")}; the ${DENTATE_RING.words.replace(": ", " is the ")}.`;
