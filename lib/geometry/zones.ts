// Zones along the canal by signed distance from the verge (stored frame, clock.ts):
// negative = perianal skin, positive = inside the canal. The boundaries vary between
// people and texts, so a clinic can configure them; the defaults carry their sources.

import { z } from "zod";
import type { Zone } from "@/lib/domain/vocab";

export type ZoneBounds = {
  /** Radius of the perianal skin outside the verge, as a positive number of cm. */
  perianalOuterCm: number;
  dentateLineCm: number;
  transformationZoneAboveCm: number;
  transformationZoneBelowCm: number;
  canalLengthCm: number;
  rectumUpToCm: number;
};

export const DEFAULT_ZONE_BOUNDS: Readonly<ZoneBounds> = Object.freeze({
  // Perianal skin = within a 5 cm radius of the verge (AJCC Cancer Staging Manual 8th ed., anus).
  perianalOuterCm: 5,
  // Dentate line 1–2 cm above the verge (Human Phenotype Ontology HP:0030440); midpoint taken.
  dentateLineCm: 1.5,
  // Anal transitional zone from the dentate line up about 1 cm (Fenger C., "The anal transitional zone").
  transformationZoneAboveCm: 1,
  // A margin below the dentate line for the squamocolumnar junction: common practice, no source.
  transformationZoneBelowCm: 0.5,
  // Surgical anal canal about 4 cm, anorectal ring to verge (Sleisenger & Fordtran, diseases of the anorectum).
  canalLengthCm: 4,
  // How far up the distal rectum is drawn: common practice, no source.
  rectumUpToCm: 8,
});

export type ZoneBand = { zone: Zone; fromCm: number; toCm: number };

/** Bands from outermost perianal skin to the top of the distal rectum, in drawing order. */
export function zoneBands(bounds: ZoneBounds = DEFAULT_ZONE_BOUNDS): ZoneBand[] {
  const tzFrom = bounds.dentateLineCm - bounds.transformationZoneBelowCm;
  const tzTo = bounds.dentateLineCm + bounds.transformationZoneAboveCm;
  return [
    { zone: "perianal", fromCm: -bounds.perianalOuterCm, toCm: 0 },
    { zone: "distal_canal", fromCm: 0, toCm: tzFrom },
    { zone: "transformation_zone", fromCm: tzFrom, toCm: tzTo },
    { zone: "proximal_canal", fromCm: tzTo, toCm: bounds.canalLengthCm },
    { zone: "distal_rectum", fromCm: bounds.canalLengthCm, toCm: bounds.rectumUpToCm },
  ];
}

/**
 * Zone at a signed distance. Each band owns its lower edge, so the verge itself (0)
 * is canal, not skin; the outer perianal edge and the top of the rectum are included.
 * Returns null beyond either end.
 */
export function zoneForDistance(cm: number, bounds: ZoneBounds = DEFAULT_ZONE_BOUNDS): Zone | null {
  if (!Number.isFinite(cm)) return null;
  const bands = zoneBands(bounds);
  const last = bands[bands.length - 1];
  if (cm < bands[0].fromCm || cm > last.toCm) return null;
  if (cm === last.toCm) return last.zone;
  return bands.find((band) => cm >= band.fromCm && cm < band.toCm)?.zone ?? null;
}

export type ZoneBoundsError = { field: keyof ZoneBounds; message: string };

/** Errors when the bands would be empty, reversed or out of order; [] when usable. */
export function validateZoneBounds(bounds: ZoneBounds): ZoneBoundsError[] {
  const errors: ZoneBoundsError[] = [];
  for (const key of Object.keys(DEFAULT_ZONE_BOUNDS) as (keyof ZoneBounds)[]) {
    if (!Number.isFinite(bounds[key]) || bounds[key] <= 0) {
      errors.push({ field: key, message: "Must be a positive number of centimetres." });
    }
  }
  if (errors.length > 0) return errors;
  const tzFrom = bounds.dentateLineCm - bounds.transformationZoneBelowCm;
  const tzTo = bounds.dentateLineCm + bounds.transformationZoneAboveCm;
  if (tzFrom <= 0) {
    errors.push({
      field: "transformationZoneBelowCm",
      message: "The transformation zone must start above the verge (dentate line minus the margin below it).",
    });
  }
  if (bounds.canalLengthCm <= tzTo) {
    errors.push({
      field: "canalLengthCm",
      message: "The canal must reach above the top of the transformation zone.",
    });
  }
  if (bounds.rectumUpToCm <= bounds.canalLengthCm) {
    errors.push({ field: "rectumUpToCm", message: "The rectum band must end above the top of the canal." });
  }
  return errors;
}

const cmField = (label: string, max: number) =>
  z
    .number({ error: `${label} must be a number of centimetres.` })
    .positive({ error: `${label} must be greater than 0 cm.` })
    .max(max, { error: `${label} must be at most ${max} cm.` });

/** Clinic configuration of the zone boundaries; checks the order of the bands too. */
export const zoneBoundsSchema = z
  .object({
    perianalOuterCm: cmField("Perianal radius", 10),
    dentateLineCm: cmField("Dentate line height", 5),
    transformationZoneAboveCm: cmField("Transformation zone above the dentate line", 5),
    transformationZoneBelowCm: cmField("Transformation zone below the dentate line", 5),
    canalLengthCm: cmField("Canal length", 10),
    rectumUpToCm: cmField("Rectum drawn up to", 20),
  })
  .superRefine((bounds, ctx) => {
    for (const error of validateZoneBounds(bounds)) {
      ctx.addIssue({ code: "custom", path: [error.field], message: error.message });
    }
  });
