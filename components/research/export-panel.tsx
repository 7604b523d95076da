"use client";

import { useMemo, useState } from "react";
import { GRADE_LABEL, GRADES } from "@/lib/domain/vocab";
import { reasonProblem } from "@/lib/validation/research";
import { ISO_DATE_INPUT } from "@/components/ui/date-input";

const DATASETS = [
  ["counts", "Lesion counts per visit"],
  ["lesions", "Lesions, one row each"],
  ["outcomes", "Outcomes per patient"],
] as const;

/**
 * Builds the download links for the streamed exports. Downloads are plain links, so the browser
 * streams the file to disk and nothing is held in page memory. An identified export is a form the
 * administrator submits (POST, Origin-checked) with the reason typed in it: a link cannot start one.
 */
export function ExportPanel({ studyId, sites, canIdentify }: { studyId: string; sites: { id: string; code: string }[]; canIdentify: boolean }) {
  const [siteId, setSiteId] = useState("");
  const [from, setFrom] = useState("");
  const [to, setTo] = useState("");
  const [grade, setGrade] = useState("");
  const [dates, setDates] = useState<"offset" | "year">("offset");
  const [identified, setIdentified] = useState(false);
  const [reason, setReason] = useState("");

  const query = useMemo(() => {
    const q = new URLSearchParams({ studyId, dates });
    if (siteId) q.set("siteId", siteId);
    if (from) q.set("from", from);
    if (to) q.set("to", to);
    if (grade) q.set("grade", grade);
    return q.toString();
  }, [studyId, dates, siteId, from, to, grade]);
  const problem = identified ? reasonProblem(reason) : null;
  const blocked = identified && problem !== null;
  const field = "min-h-11 rounded-md border border-rule-strong bg-panel px-2 font-normal";

  return (
    <div className="space-y-4">
      <fieldset className="flex flex-wrap items-end gap-3">
        <legend className="sr-only">Filters</legend>
        {sites.length > 1 ? (
          <label className="text-sm font-semibold">Site<br />
            <select value={siteId} onChange={(e) => setSiteId(e.target.value)} className={field}>
              <option value="">All my sites</option>
              {sites.map((s) => <option key={s.id} value={s.id}>{s.code}</option>)}
            </select>
          </label>
        ) : null}
        <label className="text-sm font-semibold">Visits from<br /><input {...ISO_DATE_INPUT} value={from} onChange={(e) => setFrom(e.target.value)} className={field} /></label>
        <label className="text-sm font-semibold">to<br /><input {...ISO_DATE_INPUT} value={to} onChange={(e) => setTo(e.target.value)} className={field} /></label>
        <label className="text-sm font-semibold">Grade seen<br />
          <select value={grade} onChange={(e) => setGrade(e.target.value)} className={field}>
            <option value="">Any grade</option>
            {GRADES.map((g) => <option key={g} value={g}>{GRADE_LABEL[g]}</option>)}
          </select>
        </label>
        <label className="text-sm font-semibold">Dates as<br />
          <select value={dates} onChange={(e) => setDates(e.target.value as "offset" | "year")} className={field} disabled={identified}>
            <option value="offset">Days since enrolment</option>
            <option value="year">Year only</option>
          </select>
        </label>
      </fieldset>
      {canIdentify ? (
        <div className="rounded-md border border-caution-rule bg-caution-bg p-3 text-sm text-caution-ink">
          <label className="flex items-center gap-2 font-semibold">
            <input type="checkbox" checked={identified} onChange={(e) => setIdentified(e.target.checked)} className="h-5 w-5" />
            Identified export (names, MRNs, full dates)
          </label>
          {identified ? (
            <form method="post" action="/api/exports/workbook" className="mt-2 space-y-2">
              {[...new URLSearchParams(query).entries()].map(([k, v]) => <input key={k} type="hidden" name={k} value={v} />)}
              <input type="hidden" name="identified" value="1" />
              <label className="block">Reason, kept in the audit log (say who asked and why, in words)<br />
                <input name="reason" value={reason} onChange={(e) => setReason(e.target.value)} maxLength={500} required aria-invalid={reason !== "" && blocked ? true : undefined} aria-describedby="identified-reason-rule" className={`${field} w-full`} />
              </label>
              <p id="identified-reason-rule" className="text-xs">{reason !== "" && problem ? problem : "At least 10 letters in two words or more."}</p>
              <div className="flex flex-wrap gap-2" aria-label="Identified downloads">
                {DATASETS.map(([key, label]) => (
                  <button key={key} type="submit" formAction={`/api/exports/${key}`} disabled={blocked} className="inline-flex min-h-11 items-center rounded-md border border-rule-strong bg-panel px-3 font-semibold hover:bg-lagoon-50 disabled:opacity-50">
                    {label}, identified (CSV)
                  </button>
                ))}
                <button type="submit" disabled={blocked} className="inline-flex min-h-11 items-center rounded-md bg-lagoon-600 px-3 font-semibold text-white hover:bg-lagoon-700 disabled:opacity-50">
                  All three, identified (workbook)
                </button>
              </div>
            </form>
          ) : null}
        </div>
      ) : null}
      {identified ? null : (
        <ul className="flex flex-wrap gap-2" aria-label="Downloads">
          {DATASETS.map(([key, label]) => (
            <li key={key}>
              <a href={`/api/exports/${key}?${query}`} className="inline-flex min-h-11 items-center rounded-md border border-rule-strong bg-panel px-3 font-semibold hover:bg-lagoon-50" download>
                {label} (CSV)
              </a>
            </li>
          ))}
          <li>
            <a href={`/api/exports/workbook?${query}`} className="inline-flex min-h-11 items-center rounded-md bg-lagoon-600 px-3 font-semibold text-white hover:bg-lagoon-700" download>
              All three (workbook)
            </a>
          </li>
        </ul>
      )}
      <p className="text-xs text-ink-soft">De-identified under HIPAA Safe Harbor: no names, MRNs, contact details or notes; dates as offsets or years; ages over 89 as 90+; ZIP as 3 digits (000 for small areas). Only signed visits, and none on or after a withdrawal. Every export is logged.</p>
    </div>
  );
}
