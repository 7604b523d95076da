import type {
  Acetowhite, Adequacy, AinGrade, AnaestheticAgent, Cytology, Grade, Histology, HpvResult, Lugol, Modality, Morphology, P16, Position,
  TrackStatus, Zone,
} from "@/lib/domain/vocab";

// What the visit report needs, as db/queries/report.ts loads it. Plain values only, so the
// report can be built and tested without a database.

export interface VisitReportData {
  siteId: string;
  patientId: string;
  siteName: string;
  patient: { mrn: string; familyName: string; givenName: string; dateOfBirth: string; sexAtBirth: string };
  visit: {
    visitId: string;
    visitDate: string;
    status: "draft" | "signed";
    patientPosition: Position;
    indication: string | null;
    cytology: Cytology;
    hpvResult: HpvResult;
    adequacy: Adequacy | null;
    examStartedAt: string | null;
    examEndedAt: string | null;
    anaesthesia: string | null;
    patientWeightKg: number | null;
    plan: string | null;
    signedAt: string | null;
    examinerName: string;
    signerName: string | null;
  };
  lesions: ReportLesion[];
  biopsies: ReportBiopsy[];
  treatments: ReportTreatment[];
  doses: ReportDose[];
  complications: { kind: "pain" | "bleeding" | "other"; severity: "mild" | "moderate" | "severe"; afterProcedure: boolean; note: string | null }[];
  addenda: { body: string; createdAt: string; authorName: string }[];
  diagnoses: { code: string; descriptor: string }[];
}

export interface ReportLesion {
  id: string;
  label: string;
  trackLabel: string | null;
  clockStartH: number;
  clockEndH: number;
  distanceStartCm: number;
  distanceEndCm: number;
  zone: Zone;
  grade: Grade;
  morphology: Morphology | null;
  acetowhite: Acetowhite | null;
  lugol: Lugol | null;
  vessels: string[];
  sizeMm: number | null;
  note: string | null;
  trackStatus: TrackStatus | null;
  effectiveGrade: Grade | null;
}

export interface ReportBiopsy {
  id: string;
  lesionId: string | null;
  specimenLabel: string;
  clockH: number;
  distanceCm: number;
  histology: Histology | null;
  ainGrade: AinGrade | null;
  p16: P16 | null;
  resultEnteredAt: string | null;
}

export interface ReportTreatment {
  id: string;
  lesionId: string | null;
  modality: Modality;
  regimen: string | null;
  arcs: { startH: number; endH: number }[];
  treatedFraction: number;
  extentOverrideReason: string | null;
  note: string | null;
}

export interface ReportDose {
  id: string;
  agent: AnaestheticAgent;
  concentrationPct: number;
  volumeMl: number;
  withEpinephrine: boolean;
  doseMg: number;
  overrideReason: string | null;
  overriddenByName: string | null;
}

export type Paper = "a4" | "letter";
