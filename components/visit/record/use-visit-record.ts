"use client";
import useSWR from "swr";
import { fetcher } from "@/components/data/fetcher";
import type { VisitPermissions } from "@/lib/validation/visit-record";
import type { Adequacy, Cytology, HpvResult, Position } from "@/lib/domain/vocab";

export interface VisitRecordDto {
  id: string;
  patientId: string;
  visitDate: string;
  status: "draft" | "signed";
  examinerId: string;
  examinerName: string;
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
  signedByName: string | null;
  version: number;
  extentCautionFraction: number;
}

export const visitKey = (visitId: string) => `/api/visits/${visitId}`;

export function useVisitRecord(visitId: string) {
  return useSWR<{ visit: VisitRecordDto; permissions: VisitPermissions }>(visitKey(visitId), fetcher);
}
