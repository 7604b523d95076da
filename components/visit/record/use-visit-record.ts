"use client";
import useSWR from "swr";
import { fetcher } from "@/components/data/fetcher";
import type { VisitPermissions } from "@/lib/validation/visit-record";
import type { VisitRecordDto } from "@/lib/api/types";
import { api } from "@/components/data/keys";

export type { VisitRecordDto };

export const visitKey = (visitId: string) => api.visit(visitId);

export function useVisitRecord(visitId: string) {
  return useSWR<{ visit: VisitRecordDto; permissions: VisitPermissions }>(visitKey(visitId), fetcher);
}
