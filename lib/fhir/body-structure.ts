// A lesion track as an R4 BodyStructure. R4 has no slot for clock position or distance, so the
// nearest whole hours go into locationQualifier (SNOMED clock-face codes) and the exact values
// ride in an extension and the description. (R5's bodyLandmarkOrientation would hold them directly.)
import {
  ANAL_CANAL_STRUCTURE,
  ANAL_STRUCTURE,
  LESION_EXTENT_EXTENSION,
  UCUM,
  clockFaceCoding,
  clockHoursCovered,
  formatClockHour,
} from "./terminology";
import type { BundleTrack, CodeableConcept, Extension, FhirResource, Reference } from "./types";

/** Perianal skin lies outside the verge: the stored frame gives it negative distances. */
export function isPerianal(track: Pick<BundleTrack, "distanceStartCm" | "distanceEndCm">): boolean {
  const deepest = Math.max(track.distanceStartCm, track.distanceEndCm ?? track.distanceStartCm);
  return deepest < 0;
}

export function trackLocation(track: BundleTrack): CodeableConcept {
  return isPerianal(track)
    ? { coding: [{ ...ANAL_STRUCTURE }], text: "Perianal skin" }
    : { coding: [{ ...ANAL_CANAL_STRUCTURE }], text: "Anal canal" };
}

function formatCm(cm: number): string {
  return `${Math.abs(cm).toFixed(1).replace(/\.0$/, "")} cm`;
}

function distanceText(track: BundleTrack): string {
  const { distanceStartCm: a, distanceEndCm: b } = track;
  const side = (cm: number) => (cm < 0 ? "outside" : "above");
  if (b === undefined || b === a) return `${formatCm(a)} ${side(a)} the anal verge`;
  return `${formatCm(a)} ${side(a)} to ${formatCm(b)} ${side(b)} the anal verge`;
}

export function trackDescription(track: BundleTrack): string {
  const where = isPerianal(track) ? "Perianal skin" : "Anal canal";
  const clock =
    track.clockStart === track.clockEnd
      ? `${formatClockHour(track.clockStart)} o'clock`
      : `${formatClockHour(track.clockStart)} to ${formatClockHour(track.clockEnd)} o'clock clockwise`;
  return `${where}, ${clock} (lithotomy: 12 anterior, 3 patient's left), ${distanceText(track)}`;
}

function cm(value: number) {
  return { value, unit: "cm", system: UCUM, code: "cm" };
}

export function extentExtension(track: BundleTrack): Extension {
  const parts: Extension[] = [
    { url: "clockStart", valueDecimal: track.clockStart },
    { url: "clockEnd", valueDecimal: track.clockEnd },
    { url: "distanceFromVergeStart", valueQuantity: cm(track.distanceStartCm) },
  ];
  if (track.distanceEndCm !== undefined) {
    parts.push({ url: "distanceFromVergeEnd", valueQuantity: cm(track.distanceEndCm) });
  }
  return { url: LESION_EXTENT_EXTENSION, extension: parts };
}

export function buildBodyStructure(track: BundleTrack, id: string, patient: Reference): FhirResource {
  return {
    resourceType: "BodyStructure",
    id,
    extension: [extentExtension(track)],
    active: true,
    location: trackLocation(track),
    locationQualifier: clockHoursCovered(track.clockStart, track.clockEnd).map((hour) => ({
      coding: [clockFaceCoding(hour)],
      text: `${hour} o'clock (lithotomy)`,
    })),
    description: trackDescription(track),
    patient,
  };
}
