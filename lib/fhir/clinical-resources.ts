// Observations, Procedures and DiagnosticReports for one patient's registry rows.
import { GRADE_LABEL, HISTOLOGY_LABEL } from "@/lib/domain/vocab";
import { lastFromAin } from "@/lib/codes/last";
import { trackLocation } from "./body-structure";
import { GRADE_SYSTEM, HISTOLOGY_SYSTEM, MODALITY_SYSTEM, TARGET_BODY_STRUCTURE_EXTENSION } from "./terminology";
import type { BundleBiopsy, BundleLesion, BundleTrack, BundleTreatment, CodeableConcept, FhirResource, Reference } from "./types";
import { MODALITY_WORDS } from "@/lib/domain/labels";

/** Shared by every builder: how to reference another resource and how to write a date. */
export interface MappingContext {
  ref(kind: "Patient" | "Encounter" | "BodyStructure" | "Observation" | "Procedure", id: string): Reference;
  uuid(kind: string, id: string): string;
  date(iso: string): string;
  patient: Reference;
  visitDate(visitId: string): string;
  track(trackId: string): BundleTrack | undefined;
}


function siteOf(ctx: MappingContext, trackId: string | undefined): CodeableConcept | undefined {
  const track = trackId ? ctx.track(trackId) : undefined;
  if (!track || !trackId) return undefined;
  // The bodySite extension lets the coded site point at the track's exact BodyStructure.
  return {
    ...trackLocation(track),
    extension: [{ url: "http://hl7.org/fhir/StructureDefinition/bodySite", valueReference: ctx.ref("BodyStructure", trackId) }],
  } as CodeableConcept;
}

export function buildLesionObservation(lesion: BundleLesion, ctx: MappingContext): FhirResource {
  return {
    resourceType: "Observation",
    id: ctx.uuid("Observation", lesion.id),
    status: "final",
    code: { text: "anal lesion impression" },
    subject: ctx.patient,
    encounter: ctx.ref("Encounter", lesion.visitId),
    effectiveDateTime: ctx.date(ctx.visitDate(lesion.visitId)),
    valueCodeableConcept: {
      coding: [{ system: GRADE_SYSTEM, code: lesion.grade, display: GRADE_LABEL[lesion.grade] }],
      text: GRADE_LABEL[lesion.grade],
    },
    bodySite: siteOf(ctx, lesion.trackId),
    focus: [ctx.ref("BodyStructure", lesion.trackId)],
  };
}

function targetExtensions(ctx: MappingContext, trackIds: string[]) {
  return trackIds.map((id) => ({ url: TARGET_BODY_STRUCTURE_EXTENSION, valueReference: ctx.ref("BodyStructure", id) }));
}

export function buildBiopsyProcedure(biopsy: BundleBiopsy, ctx: MappingContext): FhirResource {
  const site = siteOf(ctx, biopsy.trackId);
  return {
    resourceType: "Procedure",
    id: ctx.uuid("Procedure", biopsy.id),
    extension: biopsy.trackId ? targetExtensions(ctx, [biopsy.trackId]) : undefined,
    status: "completed",
    code: { text: "Biopsy of anal lesion" },
    subject: ctx.patient,
    encounter: ctx.ref("Encounter", biopsy.visitId),
    performedDateTime: ctx.date(ctx.visitDate(biopsy.visitId)),
    bodySite: site ? [site] : undefined,
    reasonReference: biopsy.lesionId ? [ctx.ref("Observation", biopsy.lesionId)] : undefined,
  };
}

export function buildTreatmentProcedure(treatment: BundleTreatment, ctx: MappingContext): FhirResource {
  const trackIds = treatment.trackIds ?? [];
  const sites = trackIds.map((id) => siteOf(ctx, id)).filter((s): s is CodeableConcept => s !== undefined);
  const text = MODALITY_WORDS[treatment.modality];
  return {
    resourceType: "Procedure",
    id: ctx.uuid("Procedure", `treatment:${treatment.id}`),
    extension: trackIds.length ? targetExtensions(ctx, trackIds) : undefined,
    status: "completed",
    code: { coding: [{ system: MODALITY_SYSTEM, code: treatment.modality, display: text }], text },
    subject: ctx.patient,
    encounter: ctx.ref("Encounter", treatment.visitId),
    performedDateTime: ctx.date(ctx.visitDate(treatment.visitId)),
    bodySite: sites.length ? sites : undefined,
  };
}

function histologyText(biopsy: BundleBiopsy): string {
  const base = HISTOLOGY_LABEL[biopsy.histology!];
  return biopsy.ain ? `${base} (${biopsy.ain.toUpperCase()})` : base;
}

/** The histology result and the report that carries it; nothing until pathology has reported. */
export function buildHistology(biopsy: BundleBiopsy, ctx: MappingContext): FhirResource[] {
  if (!biopsy.histology) return [];
  // An AIN2 result with a p16 stain is restated in LAST terms so the coded value is two-tier.
  const last = biopsy.ain && biopsy.p16 ? lastFromAin(biopsy.ain, biopsy.p16) : biopsy.histology;
  const effective = ctx.date(ctx.visitDate(biopsy.visitId));
  const observationUuid = ctx.uuid("Observation", `histology:${biopsy.id}`);
  const observation: FhirResource = {
    resourceType: "Observation",
    id: observationUuid,
    status: "final",
    code: { text: "anal biopsy histology" },
    subject: ctx.patient,
    encounter: ctx.ref("Encounter", biopsy.visitId),
    effectiveDateTime: effective,
    partOf: [ctx.ref("Procedure", biopsy.id)],
    valueCodeableConcept: {
      coding: [{ system: HISTOLOGY_SYSTEM, code: last, display: HISTOLOGY_LABEL[last] }],
      text: histologyText(biopsy),
    },
    bodySite: siteOf(ctx, biopsy.trackId),
  };
  const report: FhirResource = {
    resourceType: "DiagnosticReport",
    id: ctx.uuid("DiagnosticReport", biopsy.id),
    status: "final",
    code: { text: "Anal biopsy pathology report" },
    subject: ctx.patient,
    encounter: ctx.ref("Encounter", biopsy.visitId),
    effectiveDateTime: effective,
    result: [{ reference: `urn:uuid:${observationUuid}`, type: "Observation" }],
    conclusion: histologyText(biopsy),
  };
  return [observation, report];
}
