"use client";
// The visit's treatments, for the treated band on the map and the circumference figure. Same
// SWR key as the treatments panel, so a treatment recorded there shows on the map at once.
import { useMemo } from "react";
import useSWR from "swr";
import { fetcher } from "@/components/data/fetcher";
import type { TreatedArc } from "@/components/canal-map";
import { api } from "@/components/data/keys";

export interface TreatmentsView {
  treatments: { arcs: TreatedArc[] }[];
  extent: { fraction: number; level: "ok" | "caution"; message: string };
  cautionFraction: number;
}

const EMPTY: readonly TreatedArc[] = [];

export function useTreatedArcs(visitId: string) {
  const { data } = useSWR<TreatmentsView>(api.visitPart(visitId, "treatments"), fetcher);
  const arcs = useMemo(() => (data?.treatments ? data.treatments.flatMap((t) => t.arcs) : EMPTY), [data]);
  return useMemo(
    () => ({ arcs, extent: data?.treatments?.length ? data.extent : null, cautionFraction: data?.cautionFraction ?? null }),
    [arcs, data],
  );
}
