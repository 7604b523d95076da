"use client";

import { useState } from "react";
import { useRouter } from "next/navigation";
import { Button } from "@/components/ui/button";
import { sendJson } from "@/components/data/fetcher";
import { ISO_DATE_INPUT } from "@/components/ui/date-input";

export interface ConsentRow { id: string; studyId: string; studyCode: string; studyTitle: string; consentedOn: string; formVersion: string; withdrawnOn: string | null }
export interface StudyOption { id: string; code: string; title: string; consentFormVersion: string }

/** A patient's research consents: recorded and withdrawn by clinicians and administrators. */
export function ConsentsPanel({ patientId, consents, studies, canRecord, today }: { patientId: string; consents: ConsentRow[]; studies: StudyOption[]; canRecord: boolean; today: string }) {
  const router = useRouter();
  const [message, setMessage] = useState<string | null>(null);
  const [studyId, setStudyId] = useState(studies[0]?.id ?? "");
  const [date, setDate] = useState(today);
  const [pending, setPending] = useState(false);
  async function act(method: "POST" | "PATCH", url: string, body: unknown, done: string) {
    setPending(true);
    setMessage(null);
    try {
      await sendJson(method, url, body);
      setMessage(done);
      router.refresh();
    } catch (err) {
      const x = err as { message?: string; fields?: Record<string, string[]> };
      setMessage(Object.values(x.fields ?? {})[0]?.[0] ?? x.message ?? "Not saved.");
    } finally {
      setPending(false);
    }
  }
  const version = studies.find((s) => s.id === studyId)?.consentFormVersion;
  return (
    <div className="text-sm">
      {consents.length === 0 ? <p className="text-ink-soft">No research consent recorded.</p> : (
        <ul className="space-y-2">
          {consents.map((c) => (
            <li key={c.id} className="flex flex-wrap items-center gap-3">
              <span><strong>{c.studyCode}</strong> {c.studyTitle}: consented {c.consentedOn} (form {c.formVersion}){c.withdrawnOn ? <>, <strong>withdrawn {c.withdrawnOn}</strong></> : null}</span>
              {canRecord && !c.withdrawnOn ? (
                <Button variant="secondary" disabled={pending} aria-label={`Record withdrawal from ${c.studyCode} today`}
                  onClick={() => act("PATCH", `/api/patients/${patientId}/consents/${c.id}`, { withdrawnOn: today }, `Withdrawal from ${c.studyCode} recorded.`)}>
                  Record withdrawal today
                </Button>
              ) : null}
            </li>
          ))}
        </ul>
      )}
      {canRecord && studies.length > 0 ? (
        <form className="mt-3 flex flex-wrap items-end gap-3" onSubmit={(ev) => { ev.preventDefault(); void act("POST", `/api/patients/${patientId}/consents`, { studyId, consentedOn: date }, "Consent recorded."); }}>
          <div>
            <label htmlFor="consent-study" className="block font-semibold">Study</label>
            <select id="consent-study" value={studyId} onChange={(e) => setStudyId(e.target.value)} className="mt-1 min-h-11 rounded-md border border-rule-strong bg-panel px-2">
              {studies.map((s) => <option key={s.id} value={s.id}>{s.code}: {s.title}</option>)}
            </select>
          </div>
          <div>
            <label htmlFor="consent-date" className="block font-semibold">Consent signed on</label>
            <input id="consent-date" {...ISO_DATE_INPUT} value={date} max={today} onChange={(e) => setDate(e.target.value)} className="mt-1 min-h-11 rounded-md border border-rule-strong bg-panel px-2" />
          </div>
          <p className="pb-3 text-ink-soft">Form version {version ?? "—"}</p>
          <Button type="submit" disabled={pending || !studyId}>Record consent</Button>
        </form>
      ) : null}
      {message ? <p role="status" className="mt-2">{message}</p> : null}
    </div>
  );
}
