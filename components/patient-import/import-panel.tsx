"use client";

import { useState } from "react";
import Link from "next/link";
import { ApiError } from "@/components/data/fetcher";
import { Button } from "@/components/ui/button";
import { assignColumn } from "@/lib/patient-import/fields";
import { MAX_FILE_BYTES, MAX_ROWS, megabytes } from "@/lib/patient-import/limits";
import type { ImportReport, ImportResult } from "@/lib/api/types";
import { checkImportFile, ImportRefused, runImport, type ImportRequest } from "./import-api";
import { ImportSummary } from "./import-summary";
import { PreviewTable } from "./preview-table";
import { ProblemList } from "./problem-list";

type Phase = { at: "idle" } | { at: "checking" } | { at: "checked" } | { at: "importing"; done: number; total: number } | { at: "done"; result: ImportResult };

export function ImportPanel({ sites }: { sites: { id: string; name: string }[] }) {
  const [siteId, setSiteId] = useState(sites[0]?.id ?? "");
  const [file, setFile] = useState<Omit<ImportRequest, "siteId" | "mapping"> | null>(null);
  const [report, setReport] = useState<ImportReport | null>(null);
  const [accept, setAccept] = useState(false);
  const [phase, setPhase] = useState<Phase>({ at: "idle" });
  const [error, setError] = useState<string[] | null>(null);

  async function check(request: ImportRequest) {
    setPhase({ at: "checking" });
    setError(null);
    setAccept(false);
    try {
      setReport(await checkImportFile(request));
      setPhase({ at: "checked" });
    } catch (e) {
      setReport(null);
      setError(e instanceof ApiError ? [e.message, ...(e.fields?.file ?? []).filter((l) => l !== e.message)] : ["The file could not be checked."]);
      setPhase({ at: "idle" });
    }
  }

  async function choose(f: File | undefined) {
    setReport(null);
    setPhase({ at: "idle" });
    if (!f) return setFile(null);
    if (f.size > MAX_FILE_BYTES) {
      setFile(null);
      return setError([`${f.name} is ${megabytes(f.size)}; at most ${megabytes(MAX_FILE_BYTES)} can be imported at once. Split it into smaller files.`]);
    }
    const content = await f.text();
    const format = /\.json$/i.test(f.name) || /^\s*\{/.test(content) ? "fhir" : "csv";
    const picked = { fileName: f.name, content, format } as const;
    setFile(picked);
    await check({ ...picked, siteId });
  }

  async function start() {
    if (!file || !report) return;
    setError(null);
    setPhase({ at: "importing", done: 0, total: report.plan.create + report.plan.update });
    try {
      const result = await runImport({ ...file, siteId, mapping: file.format === "csv" ? report.mapping : undefined, acceptValidRows: accept }, (done, total) => setPhase({ at: "importing", done, total }));
      setPhase({ at: "done", result });
    } catch (e) {
      if (e instanceof ImportRefused && e.report) setReport(e.report);
      setError([e instanceof ApiError ? e.message : "The import failed. Nothing was imported."]);
      setPhase({ at: "checked" });
    }
  }

  const busy = phase.at === "checking" || phase.at === "importing";
  const ready = report ? report.plan.create + report.plan.update + report.plan.unchanged : 0;
  const canImport = !!report && report.mappingProblems.length === 0 && ready > 0 && (report.badRows === 0 || accept) && !busy && phase.at !== "done";

  return (
    <div className="mt-4 space-y-4">
      <div className="flex flex-wrap items-end gap-4 rounded-lg border border-rule bg-panel p-3">
        {sites.length > 1 ? (
          <label className="text-sm font-semibold">Import into<br />
            <select value={siteId} disabled={busy} onChange={(e) => { setSiteId(e.target.value); if (file) void check({ ...file, siteId: e.target.value, mapping: report?.mapping }); }} className="min-h-11 rounded-md border border-rule-strong bg-panel px-2 font-normal">
              {sites.map((s) => <option key={s.id} value={s.id}>{s.name}</option>)}
            </select>
          </label>
        ) : <p className="text-sm">Into <strong>{sites[0]?.name}</strong></p>}
        <label className="text-sm font-semibold">File (CSV, or a FHIR R4 Bundle of Patients as .json)<br />
          <input type="file" accept=".csv,.txt,.json,text/csv,application/json,application/fhir+json" disabled={busy} onChange={(e) => void choose(e.target.files?.[0])} className="mt-1 block min-h-11 text-sm font-normal file:mr-3 file:min-h-11 file:rounded-md file:border file:border-rule-strong file:bg-panel file:px-3 file:font-semibold" />
        </label>
        <p className="text-sm text-ink-soft">At most {MAX_ROWS.toLocaleString("en")} patients and {megabytes(MAX_FILE_BYTES)} per file. An MRN already at the site updates that patient; nothing is imported until you confirm below.</p>
      </div>

      {error ? <div role="alert" className="rounded-md border-l-4 border-danger-rule bg-danger-bg px-3 py-2 text-sm text-danger-ink">{error.map((l, i) => <p key={i} className={i === 0 ? "font-bold" : ""}>{l}</p>)}</div> : null}
      {phase.at === "checking" ? <p role="status" className="text-sm">Checking every row of {file?.fileName}…</p> : null}

      {report ? (
        <>
          <ImportSummary report={report} fileName={file?.fileName ?? ""} />
          <PreviewTable report={report} disabled={busy} onColumnChange={report.format === "csv" && file ? (column, field) => void check({ ...file, siteId, mapping: assignColumn(report.mapping, column, field) }) : undefined} />
          <ProblemList report={report} />
          <div className="space-y-3 rounded-lg border border-rule bg-panel p-3">
            {report.badRows > 0 && ready > 0 && report.mappingProblems.length === 0 ? (
              <label className="flex min-h-11 items-start gap-3 text-sm">
                <input type="checkbox" checked={accept} disabled={busy || phase.at === "done"} onChange={(e) => setAccept(e.target.checked)} className="mt-1 size-5" />
                <span><strong>Import the valid rows</strong> ({ready.toLocaleString("en")}) and leave out the {report.badRows.toLocaleString("en")} with problems. They can be corrected and imported later; rows already imported will then be unchanged.</span>
              </label>
            ) : null}
            <div className="flex flex-wrap items-center gap-3">
              <Button onClick={() => void start()} disabled={!canImport}>{phase.at === "importing" ? "Importing…" : `Import ${ready.toLocaleString("en")} ${ready === 1 ? "patient" : "patients"}`}</Button>
              {report.badRows > 0 && !accept && ready > 0 && phase.at === "checked" ? <p className="text-sm text-ink-soft">Nothing is imported while rows have problems: correct the file and choose it again, or tick “Import the valid rows”.</p> : null}
              {phase.at === "importing" ? (
                <label className="flex items-center gap-2 text-sm">Writing
                  <progress max={Math.max(1, phase.total)} value={phase.done} className="h-3 w-64" />
                  <span className="tabular-nums">{phase.done.toLocaleString("en")} of {phase.total.toLocaleString("en")}</span>
                </label>
              ) : null}
            </div>
            {phase.at === "done" ? (
              <p role="status" className="font-semibold text-ok-ink">
                Imported: {phase.result.created} new, {phase.result.updated} updated, {phase.result.unchanged} unchanged{phase.result.skipped ? `, ${phase.result.skipped} left out` : ""}. <Link href="/patients" className="text-lagoon-700 underline">Back to the patient list</Link>
              </p>
            ) : null}
          </div>
        </>
      ) : null}
    </div>
  );
}
