"use client";

import type { ImportField } from "@/lib/patient-import/fields";
import type { ImportReport } from "@/lib/api/types";

/**
 * The first rows of the file as they are in it, with a choice above each column of the field it
 * fills. Rows with a problem are marked (a symbol and a tint, not colour alone).
 */
export function PreviewTable({ report, onColumnChange, disabled }: { report: ImportReport; onColumnChange?: (column: number, field: ImportField | null) => void; disabled?: boolean }) {
  const fieldOf = (column: number) => (Object.entries(report.mapping).find(([, c]) => c === column)?.[0] ?? null) as ImportField | null;
  const bad = new Set(report.problems.map((p) => p.line));
  const unitLabel = report.unit === "line" ? "Line" : "Entry";
  return (
    // relative: the screen-reader-only labels are positioned, and must be clipped with the table.
    <div className="relative overflow-x-auto rounded-lg border border-rule bg-panel">
      <table className="w-full border-collapse text-left text-sm">
        <caption className="px-2 py-1.5 text-left text-sm text-ink-soft">
          The first {report.preview.length} of {report.total.toLocaleString("en")} {report.unit === "line" ? "rows" : "entries"} as they are in the file.{onColumnChange ? " Choose what each column imports as; fields marked * are required." : ""}
        </caption>
        <thead className="bg-lagoon-50">
          <tr>
            <th scope="col" className="px-2 py-2 align-bottom">{unitLabel}</th>
            {report.headers.map((h, i) => (
              <th key={i} scope="col" className="min-w-36 px-2 py-2 align-bottom">
                <span className="block truncate font-semibold" title={h}>{h || `Column ${i + 1}`}</span>
                {onColumnChange ? (
                  <label className="mt-1 block text-xs font-normal text-ink-soft">
                    <span className="sr-only">Column {i + 1} ({h}) </span>imports as
                    <select
                      value={fieldOf(i) ?? ""}
                      disabled={disabled}
                      onChange={(e) => onColumnChange(i, (e.target.value || null) as ImportField | null)}
                      className="mt-0.5 block min-h-11 w-full rounded-md border border-rule-strong bg-panel px-1 text-sm text-ink"
                    >
                      <option value="">Not imported</option>
                      {report.fields.map((f) => <option key={f.key} value={f.key}>{f.label}{f.required ? " *" : ""}</option>)}
                    </select>
                  </label>
                ) : null}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {report.preview.map((r) => (
            <tr key={r.line} className={`border-t border-rule ${bad.has(r.line) ? "bg-danger-bg" : ""}`}>
              <th scope="row" className="whitespace-nowrap px-2 py-1.5 font-semibold tabular-nums">
                {bad.has(r.line) ? <span aria-label="has problems" className="text-danger-ink">✕ </span> : <span aria-label="ready" className="text-ok-ink">✓ </span>}
                {r.line}
              </th>
              {report.headers.map((_, i) => (
                <td key={i} className={`max-w-48 truncate px-2 py-1.5 ${fieldOf(i) ? "" : "text-ink-soft line-through decoration-rule-strong"}`} title={r.cells[i]}>
                  {(r.cells[i] ?? "").slice(0, 80)}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
