// Code systems and codes used in the FHIR export.
// SNOMED CT clock-face positions: FHIR value set bodystructure-bodylandmarkorientation-clockface-position
// (listed in HL7 FHIR value set, SNOMED CT). Anatomical site codes from the same section.

import { isFullCircle } from "@/lib/geometry/arcs";

export const SNOMED = "http://snomed.info/sct";
export const UCUM = "http://unitsofmeasure.org";
export const V3_ACT_CODE = "http://terminology.hl7.org/CodeSystem/v3-ActCode";

/** Our own namespace for code systems and extensions that no standard covers. */
export const DENTATE_FHIR_BASE = "https://dentate.example/fhir";
export const GRADE_SYSTEM = `${DENTATE_FHIR_BASE}/CodeSystem/impression-grade`;
export const HISTOLOGY_SYSTEM = `${DENTATE_FHIR_BASE}/CodeSystem/histology-last`;
export const MODALITY_SYSTEM = `${DENTATE_FHIR_BASE}/CodeSystem/treatment-modality`;
export const PATIENT_ID_SYSTEM = `${DENTATE_FHIR_BASE}/NamingSystem/mrn`;
export const STUDY_ID_SYSTEM = `${DENTATE_FHIR_BASE}/NamingSystem/study-subject`;
export const LESION_EXTENT_EXTENSION = `${DENTATE_FHIR_BASE}/StructureDefinition/lesion-clock-extent`;

/** R4 core extension that points a Procedure at the BodyStructure it treated or sampled. */
export const TARGET_BODY_STRUCTURE_EXTENSION = "http://hl7.org/fhir/StructureDefinition/procedure-targetBodyStructure";
/** US Core birth sex extension (values F, M, UNK; from memory). */
export const BIRTH_SEX_EXTENSION = "http://hl7.org/fhir/us/core/StructureDefinition/us-core-birthsex";

/** SNOMED CT code for each o'clock position, indexed by hour 1..12. */
export const CLOCK_FACE_SNOMED: Readonly<Record<number, string>> = {
  1: "260318004",
  2: "260328008",
  3: "260330005",
  4: "260333007",
  5: "260335000",
  6: "260337008",
  7: "260339006",
  8: "260341007",
  9: "260343005",
  10: "260322009",
  11: "260324005",
  12: "260326007",
};

export const ANAL_CANAL_STRUCTURE = { system: SNOMED, code: "34381000", display: "Anal canal structure" } as const;
// No perianal-skin concept has a sourced SNOMED CT code here, so lesions outside the verge use the broader
// "anal structure" concept and say "perianal skin" in the text.
export const ANAL_STRUCTURE = { system: SNOMED, code: "53505006", display: "Anal structure" } as const;

/** Nearest whole hour on the clock face, 1..12, for a stored decimal hour in [0, 12). */
export function nearestClockHour(clockHour: number): number {
  if (!Number.isFinite(clockHour)) throw new RangeError("clock hour must be finite");
  const wrapped = ((clockHour % 12) + 12) % 12;
  const rounded = Math.round(wrapped) % 12;
  return rounded === 0 ? 12 : rounded;
}

/** The whole hours an arc touches, going clockwise from its start hour to its end hour. */
export function clockHoursCovered(clockStart: number, clockEnd: number): number[] {
  if (isFullCircle({ startH: clockStart, endH: clockEnd })) return [12, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11];
  const first = nearestClockHour(clockStart);
  const last = nearestClockHour(clockEnd);
  const hours = [first];
  for (let h = first; h !== last; ) {
    h = (h % 12) + 1;
    hours.push(h);
  }
  return hours;
}

export function clockFaceCoding(hour: number) {
  const code = CLOCK_FACE_SNOMED[hour];
  if (!code) throw new RangeError(`No clock-face code for hour ${hour}`);
  // No display: the exact SNOMED descriptions are not in our sources, and display is optional.
  return { system: SNOMED, code };
}

/** Text for a decimal clock hour: 0 is shown as 12, minutes as a decimal hour ("2.5"). */
export function formatClockHour(clockHour: number): string {
  const h = ((clockHour % 12) + 12) % 12;
  const shown = h < 1 ? h + 12 : h;
  return Number.isInteger(shown) ? String(shown) : shown.toFixed(2).replace(/0+$/, "").replace(/\.$/, "");
}
