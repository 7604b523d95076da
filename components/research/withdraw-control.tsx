"use client";

import { useState } from "react";
import { useRouter } from "next/navigation";
import { ApiError, sendJson } from "@/components/data/fetcher";
import { ISO_DATE_INPUT } from "@/components/ui/date-input";

/** Records a withdrawal date; from that date on, the subject's visits leave every export. */
export function WithdrawControl({ studyId, enrolmentId, studySubjectId, consentDate, today }: { studyId: string; enrolmentId: string; studySubjectId: string; consentDate: string; today: string }) {
  const router = useRouter();
  const [open, setOpen] = useState(false);
  const [date, setDate] = useState(today);
  const [error, setError] = useState<string | null>(null);

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    setError(null);
    try {
      await sendJson("PATCH", `/api/studies/${studyId}/enrolments/${enrolmentId}`, { withdrawnOn: date });
      setOpen(false);
      router.refresh();
    } catch (err) {
      setError(err instanceof ApiError ? Object.values(err.fields ?? {})[0]?.[0] ?? err.message : "The withdrawal was not saved.");
    }
  }

  if (!open) {
    return <button type="button" onClick={() => setOpen(true)} className="min-h-11 rounded-md border border-rule-strong px-3 text-sm font-semibold hover:bg-lagoon-50">Record withdrawal</button>;
  }
  return (
    <form onSubmit={submit} className="flex flex-wrap items-center gap-2" aria-label={`Withdraw ${studySubjectId}`}>
      <input {...ISO_DATE_INPUT} aria-label="Withdrawal date" value={date} min={consentDate} onChange={(e) => setDate(e.target.value)} required className="min-h-11 rounded-md border border-rule-strong px-2" />
      <button className="min-h-11 rounded-md bg-danger-ink px-3 text-sm font-semibold text-white">Withdraw</button>
      <button type="button" onClick={() => setOpen(false)} className="min-h-11 rounded-md px-3 text-sm font-semibold text-lagoon-700">Cancel</button>
      {error ? <p role="alert" className="w-full text-sm text-danger-ink">{error}</p> : null}
    </form>
  );
}
