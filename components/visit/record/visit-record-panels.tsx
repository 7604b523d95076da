"use client";
import { useNumbering } from "@/components/visit/numbering";
import { AnaestheticPanel } from "./anaesthetic-panel";
import { ComplicationsPanel } from "./complications-panel";
import { DiagnosesPanel } from "./diagnoses-panel";
import { ExamDetailsForm } from "./exam-details-form";
import { FormError } from "./field";
import { SigningPanel } from "./signing-panel";
import { TreatmentsPanel } from "./treatments-panel";
import { useVisitRecord } from "./use-visit-record";

/** The visit record around the map: exam details, procedure, codes and signature. */
/**
 * `part` splits the record for the tabs beside the map: the procedure (anaesthetic, treatment,
 * complications) and the rest of the record (exam details, codes, signature).
 */
export function VisitRecordPanels({ visitId, part = "all" }: { visitId: string; part?: "all" | "procedure" | "record" }) {
  const { data, error, isLoading } = useVisitRecord(visitId);
  // The page's numbering (the position of the examination unless the user switched), as on the map.
  const { conv } = useNumbering("lithotomy");
  if (error) return <FormError message={error.message} />;
  if (isLoading || !data) return <p className="text-ink-soft" role="status">Loading the visit record…</p>;
  const { visit, permissions } = data;
  return (
    <div className="flex flex-col gap-4" data-testid="visit-record-panels">
      {visit.status === "signed" && part !== "procedure" ? (
        <p role="status" className="rounded-md border border-rule-strong bg-panel px-3 py-2 font-semibold">✓ Signed record: read-only. Add an addendum below for anything new.</p>
      ) : null}
      {part !== "procedure" ? <ExamDetailsForm visit={visit} canEdit={permissions.canEdit} /> : null}
      {part !== "record" ? (
        <>
          <AnaestheticPanel visitId={visitId} canEdit={permissions.canEdit} />
          <TreatmentsPanel visitId={visitId} canEdit={permissions.canEdit} conv={conv} />
          <ComplicationsPanel visitId={visitId} canEdit={permissions.canEdit} />
        </>
      ) : null}
      {part !== "procedure" ? (
        <>
          <DiagnosesPanel visitId={visitId} canEdit={permissions.canEdit} />
          <SigningPanel visit={visit} permissions={permissions} conv={conv} />
        </>
      ) : null}
    </div>
  );
}
