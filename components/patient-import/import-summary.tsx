import type { ImportReport } from "@/lib/api/types";

/** What the check found, in one line, and what the file means for the site's patients. */
export function ImportSummary({ report, fileName }: { report: ImportReport; fileName: string }) {
  const rows = report.unit === "line" ? "rows" : "entries";
  return (
    <section aria-label="What the check found" className="space-y-2">
      <p>
        <strong>{fileName}</strong>: {report.total.toLocaleString("en")} {rows}.{" "}
        {report.mappingProblems.length === 0 ? (
          <>
            {report.plan.create.toLocaleString("en")} new, {report.plan.update.toLocaleString("en")} to update, {report.plan.unchanged.toLocaleString("en")} unchanged
            {report.badRows ? <>; <strong className="text-danger-ink">{report.badRows.toLocaleString("en")} with problems</strong></> : null}. Nothing has been written yet.
          </>
        ) : null}
      </p>
      {report.mappingProblems.length ? (
        <div role="alert" className="rounded-md border-l-4 border-caution-rule bg-caution-bg px-3 py-2 text-sm text-caution-ink">
          <p className="font-bold">Choose a column for each required field</p>
          <ul className="list-disc pl-5">{report.mappingProblems.map((m) => <li key={m}>{m}</li>)}</ul>
        </div>
      ) : null}
      {report.notes.map((n) => <p key={n} className="text-sm text-ink-soft">{n}</p>)}
    </section>
  );
}
