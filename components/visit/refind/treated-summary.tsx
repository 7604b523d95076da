"use client";
import { Caution } from "@/components/ui/caution";
import { ExtentWhy } from "@/components/visit/record/extent-why";
import type { TreatmentsView } from "./use-treated-arcs";

/** The treated share of the circumference under the map; the server's caution when it is large. */
export function TreatedSummary({ extent, cautionFraction }: { extent: TreatmentsView["extent"] | null; cautionFraction: number | null }) {
  if (!extent) return null;
  if (extent.level === "caution") {
    return (
      <div data-treated-summary="caution">
        <Caution title={extent.message}>{cautionFraction !== null ? <ExtentWhy cautionFraction={cautionFraction} /> : null}</Caution>
      </div>
    );
  }
  return <p data-treated-summary="ok" className="text-sm"><span aria-hidden="true">▤ </span>{extent.message}</p>;
}
