// Display conventions: how the stored lithotomy frame is numbered on screen for the
// position the patient lay in. Storage never changes; only the numbers shown do.
//
// - lithotomy: identity (it is the stored frame).
// - prone_jackknife: the examiner looks from the other side of the body, so the face
//   turns half a circle: 12 posterior, 6 anterior, 3 the patient's right, 9 the
//   patient's left (surgical anatomy texts, derived, from memory).
// - left_lateral (Sims): no single published clock convention was found and many
//   clinicians keep lithotomy numbering (surgical anatomy texts), so the numbers stay as in
//   lithotomy. Because the numbers alone are ambiguous in this position, the UI must
//   show the anatomical labels below next to them. Surgical texts advise recording
//   anatomical terms for exactly this reason ("Investigations for Anorectal
//   Disease", in Anorectal Disease, Springer).

import type { Position } from "@/lib/domain/vocab";
import { formatClock, normalizeHours } from "./clock";
import { isFullCircle } from "./arcs";

export type DisplayConvention = Position;

/** Hours added to the stored value to get the displayed value. */
const DISPLAY_OFFSET_H: Record<DisplayConvention, number> = {
  lithotomy: 0,
  prone_jackknife: 6,
  left_lateral: 0,
};

export function toDisplayHours(storedH: number, conv: DisplayConvention): number {
  return normalizeHours(storedH + DISPLAY_OFFSET_H[conv]);
}

export function fromDisplayHours(displayH: number, conv: DisplayConvention): number {
  return normalizeHours(displayH - DISPLAY_OFFSET_H[conv]);
}

export type AnatomicalLabel = "Anterior" | "Posterior" | "Patient's left" | "Patient's right";

/** Stored-frame hours of the four anatomical directions (lithotomy definition). */
const CARDINAL_STORED: ReadonlyArray<readonly [number, AnatomicalLabel]> = [
  [0, "Anterior"],
  [3, "Patient's left"],
  [6, "Posterior"],
  [9, "Patient's right"],
];

/** Display hours at which the diagram carries an anatomical label: 12, 3, 6 and 9. */
export const CARDINAL_DISPLAY_HOURS = [0, 3, 6, 9] as const;

/**
 * Anatomical label for a cardinal display position (12/3/6/9) in a convention, found by
 * mapping back to the stored frame so that no convention has its own table.
 * Returns null for positions that are not cardinal.
 */
export function anatomicalLabelAt(displayH: number, conv: DisplayConvention): AnatomicalLabel | null {
  const storedH = fromDisplayHours(displayH, conv);
  const hit = CARDINAL_STORED.find(([h]) => Math.abs(h - storedH) < 1e-9 || Math.abs(h + 12 - storedH) < 1e-9);
  return hit ? hit[1] : null;
}

export const SECTORS = [
  "anterior",
  "left anterior",
  "left lateral",
  "left posterior",
  "posterior",
  "right posterior",
  "right lateral",
  "right anterior",
] as const;
export type Sector = (typeof SECTORS)[number];

const SECTOR_WIDTH_H = 12 / SECTORS.length;

/**
 * One of eight anatomical sectors, each 1.5 h wide and centred on 12, 1:30, 3, …, 10:30
 * in the stored frame. A position exactly on a border belongs to the next sector clockwise.
 */
export function sectorName(storedH: number): Sector {
  const index = Math.round(normalizeHours(storedH) / SECTOR_WIDTH_H) % SECTORS.length;
  return SECTORS[index];
}

function formatCm(cm: number): string {
  const rounded = Math.round(Math.abs(cm) * 10) / 10;
  return String(rounded);
}

function describeDistance(aCm: number, bCm: number): string {
  const lo = Math.min(aCm, bCm);
  const hi = Math.max(aCm, bCm);
  if (lo === 0 && hi === 0) return "at the verge";
  if (lo >= 0) {
    return lo === hi ? `${formatCm(lo)} cm from the verge` : `${formatCm(lo)}–${formatCm(hi)} cm from the verge`;
  }
  if (hi <= 0) {
    const near = formatCm(hi);
    const far = formatCm(lo);
    return near === far ? `perianal skin, ${far} cm outside the verge` : `perianal skin, ${near}–${far} cm outside the verge`;
  }
  return `from ${formatCm(lo)} cm outside to ${formatCm(hi)} cm inside the verge`;
}

function clockWords(h: number): string {
  return formatClock(h).replace(" o'clock", "");
}

/**
 * Plain-language site for screen readers, e.g.
 * "1 to 3 o'clock (left anterior to left lateral), 1–2 cm from the verge".
 * Hours are stored-frame values; numbers are shown in the given convention and the
 * sector words are anatomical, so they read the same in every convention.
 */
export function describeSite(
  startH: number,
  endH: number,
  distStartCm: number,
  distEndCm: number,
  conv: DisplayConvention = "lithotomy",
): string {
  if (isFullCircle({ startH, endH })) return `the whole circumference, ${describeDistance(distStartCm, distEndCm)}`;
  const startSector = sectorName(startH);
  const endSector = sectorName(endH);
  const sectors = startSector === endSector ? startSector : `${startSector} to ${endSector}`;
  const a = toDisplayHours(startH, conv);
  const b = toDisplayHours(endH, conv);
  const clock = formatClock(a) === formatClock(b) ? formatClock(a) : `${clockWords(a)} to ${formatClock(b)}`;
  return `${clock} (${sectors}), ${describeDistance(distStartCm, distEndCm)}`;
}
