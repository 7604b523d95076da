"use client";
import useSWR from "swr";
import { fetcher } from "@/components/data/fetcher";
import type { VisitPermissions } from "@/lib/validation/visit-record";

export interface VisitRecordDto {
  id: string;
  patientId: string;
  visitDate: string;
  status: "draft" | "signed";
  examinerId: string;
  examinerName: string;
  patientPosition: "lithotomy" | "prone_jackknife" | "left_lateral";
  indication: string | null;
  cytology: "nilm" | "asc_us" | "asc_h" | "lsil" | "hsil" | "scc" | "unsatisfactory" | "not_done";
  hpvResult: "not_done" | "negative" | "hr_positive_16" | "hr_positive_other" | "lr_positive";
  adequacy: "scj_full" | "scj_partial" | "scj_not_seen" | null;
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
