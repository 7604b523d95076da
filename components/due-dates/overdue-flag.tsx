// The follow-up flag. <OverdueBadge> is plain; <FollowupBanner> shows the patient page's due
// date, loudly when overdue, and lets a clinician set their own date with a reason.
import type { PatientDue } from "@/lib/due-dates/patient-due";
import { OverrideForm, type OverrideAction } from "./override-form";

export function OverdueBadge({ overdueDays, dateProblem }: { overdueDays: number; dateProblem?: boolean }) {
  if (dateProblem) return <span className="inline-flex items-center gap-1 rounded border-2 border-danger-rule bg-danger-bg px-2 py-0.5 text-xs font-bold text-danger-ink">⚑ Check the visit date</span>;
  if (overdueDays <= 0) return <span className="inline-flex items-center gap-1 rounded border border-rule-strong px-2 py-0.5 text-xs font-semibold text-ink-soft">◷ Due soon</span>;
  return (
    <span className="inline-flex items-center gap-1 rounded border-2 border-danger-rule bg-danger-bg px-2 py-0.5 text-xs font-bold text-danger-ink">
      ⚑ Overdue {overdueDays} {overdueDays === 1 ? "day" : "days"}
    </span>
  );
}

export function FollowupBanner({ patientId, due, overrideAction }: { patientId: string; due: PatientDue | null; overrideAction?: OverrideAction }) {
  if (!due) {
    return (
      <section aria-label="Follow-up" className="rounded-md border border-rule bg-panel px-4 py-3 text-sm text-ink-soft">
        No visit yet: the next visit date appears after the first examination.
      </section>
    );
  }
  if (due.dateProblem) {
    return (
      <section aria-label="Follow-up" role="alert" className="rounded-md border-l-4 border-danger-rule bg-danger-bg px-4 py-3 text-danger-ink">
        <p className="font-bold">⚑ No next visit date: a stored visit date ({due.lastVisitDate}) cannot be worked with.</p>
        <p className="mt-1 text-sm">Correct the visit date; until then no reminder is sent for this patient.</p>
      </section>
    );
  }
  const overdue = due.overdueDays > 0;
  const isOverride = due.ruleKey === "clinician_override";
  return (
    <section aria-label="Follow-up" role={overdue ? "alert" : undefined}
      className={`rounded-md border-l-4 px-4 py-3 ${overdue ? "border-danger-rule bg-danger-bg text-danger-ink" : "border-lagoon-600 bg-lagoon-50 text-ink"}`}>
      <p className="font-bold">
        {overdue ? `⚑ Follow-up overdue by ${due.overdueDays} ${due.overdueDays === 1 ? "day" : "days"}` : "Next visit due"}
        <span className="ml-2 tabular-nums">{due.dueDate}</span>
      </p>
      <p className="mt-1 text-sm">
        {isOverride ? <>Clinician&apos;s date: {due.reason}</> : due.reason}. Last visit {due.lastVisitDate}. Guidance only: local protocol and the clinician decide.
      </p>
      {overrideAction ? <OverrideForm patientId={patientId} hasOverride={isOverride} overrideAction={overrideAction} /> : null}
    </section>
  );
}
