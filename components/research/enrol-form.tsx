"use client";

import { useState } from "react";
import { useRouter } from "next/navigation";
import { ApiError, sendJson } from "@/components/data/fetcher";
import { api } from "@/components/data/keys";
import { ISO_DATE_INPUT } from "@/components/ui/date-input";

export interface Candidate {
  ref: string;
  siteId: string;
  siteCode: string;
  firstVisitYear: number | null;
  visits: number;
}

/**
 * Enrols a consenting patient picked by opaque reference (site code + 12 hex digits). The clinic
 * hands the nurse the reference; the nurse never sees a name or an MRN.
 */
export function EnrolForm({ studyId, candidates, suggestedId, today }: { studyId: string; candidates: Candidate[]; suggestedId: string; today: string }) {
  const router = useRouter();
  const [pick, setPick] = useState("");
  const [subjectId, setSubjectId] = useState(suggestedId);
  const [consentDate, setConsentDate] = useState(today);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    const candidate = candidates.find((c) => `${c.siteId}:${c.ref}` === pick);
    if (!candidate) return setError("Choose a patient reference from the list.");
    setBusy(true);
    setError(null);
    try {
      await sendJson("POST", api.studyEnrolments(studyId), { candidateRef: candidate.ref, siteId: candidate.siteId, studySubjectId: subjectId, consentDate });
      setPick("");
      router.refresh();
    } catch (err) {
      setError(err instanceof ApiError ? Object.values(err.fields ?? {})[0]?.[0] ?? err.message : "The enrolment was not saved.");
    } finally {
      setBusy(false);
    }
  }

  if (candidates.length === 0) return <p className="text-sm text-ink-soft">No consenting patient at your sites is waiting for enrolment.</p>;
  return (
    <form onSubmit={submit} aria-label="Enrol a patient" className="flex flex-wrap items-end gap-3">
      <label className="text-sm font-semibold">Patient reference<br />
        <select value={pick} onChange={(e) => setPick(e.target.value)} required className="min-h-11 rounded-md border border-rule-strong bg-panel px-2 font-mono font-normal">
          <option value="">Choose…</option>
          {candidates.map((c) => (
            <option key={`${c.siteId}:${c.ref}`} value={`${c.siteId}:${c.ref}`}>
              {c.siteCode} · {c.ref} ({c.visits} visit{c.visits === 1 ? "" : "s"}{c.firstVisitYear ? ` since ${c.firstVisitYear}` : ""})
            </option>
          ))}
        </select>
      </label>
      <label className="text-sm font-semibold">Study ID<br />
        <input value={subjectId} onChange={(e) => setSubjectId(e.target.value)} required maxLength={32} className="min-h-11 w-36 rounded-md border border-rule-strong px-2 font-normal" />
      </label>
      <label className="text-sm font-semibold">Consent date<br />
        <input {...ISO_DATE_INPUT} value={consentDate} max={today} onChange={(e) => setConsentDate(e.target.value)} required className="min-h-11 rounded-md border border-rule-strong px-2 font-normal" />
      </label>
      <button disabled={busy} className="min-h-11 rounded-md bg-lagoon-600 px-4 font-semibold text-white hover:bg-lagoon-700 disabled:bg-rule-strong">{busy ? "Enrolling…" : "Enrol"}</button>
      {error ? <p role="alert" className="w-full text-sm text-danger-ink">{error}</p> : null}
    </form>
  );
}
