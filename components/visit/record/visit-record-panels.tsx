"use client";
import useSWR from "swr";
import { fetcher } from "@/components/data/fetcher";
import type { DisplayConvention } from "@/lib/geometry";
import { AnaestheticPanel } from "./anaesthetic-panel";
import { ComplicationsPanel } from "./complications-panel";
import { DiagnosesPanel } from "./diagnoses-panel";
import { ExamDetailsForm } from "./exam-details-form";
import { FormError } from "./field";
import { SigningPanel } from "./signing-panel";
import { TreatmentsPanel } from "./treatments-panel";
import { useVisitRecord } from "./use-visit-record";
import { api } from "@/components/data/keys";

/** The visit record around the map: exam details, procedure, codes and signature. */
export function VisitRecordPanels({ visitId }: { visitId: string }) {
  const { data, error, isLoading } = useVisitRecord(visitId);
  const { data: prefs } = useSWR<{ displayConvention: DisplayConvention }>(api.preferences, fetcher);
  if (error) return <FormError message={error.message} />;
  if (isLoading || !data) return <p className="text-ink-soft" role="status">Loading the visit record…</p>;
  const { visit, permissions } = data;
  const conv = prefs?.displayConvention ?? "lithotomy";
  return (
    <div className="flex flex-col gap-4" data-testid="visit-record-panels">
      {visit.status === "signed" ? (
        <p role="status" className="rounded-md border border-rule-strong bg-panel px-3 py-2 font-semibold">✓ Signed record: read-only. Add an addendum below for anything new.</p>
      ) : null}
      <ExamDetailsForm visit={visit} canEdit={permissions.canEdit} />
      <AnaestheticPanel visitId={visitId} canEdit={permissions.canEdit} />
      <TreatmentsPanel visitId={visitId} canEdit={permissions.canEdit} conv={conv} />
      <ComplicationsPanel visitId={visitId} canEdit={permissions.canEdit} />
      <DiagnosesPanel visitId={visitId} canEdit={permissions.canEdit} />
      <SigningPanel visit={visit} permissions={permissions} />
    </div>
  );
}
