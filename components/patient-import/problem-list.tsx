import type { ImportReport } from "@/lib/api/types";

/** Every problem of the file, by line (or bundle entry), in file order. */
export function ProblemList({ report }: { report: ImportReport }) {
  if (report.problems.length === 0) return null;
  const unit = report.unit === "line" ? "Line" : "Entry";
  const byLine = new Map<number, string[]>();
  for (const p of report.problems) byLine.set(p.line, [...(byLine.get(p.line) ?? []), p.message]);
  return (
    <section aria-labelledby="import-problems" className="rounded-lg border border-danger-rule bg-panel">
      <h2 id="import-problems" className="border-b border-danger-rule bg-danger-bg px-3 py-2 font-bold text-danger-ink">
        {report.badRows} {report.badRows === 1 ? (report.unit === "line" ? "row has" : "entry has") : report.unit === "line" ? "rows have" : "entries have"} problems
      </h2>
      <ol className="max-h-96 divide-y divide-rule overflow-y-auto">
        {[...byLine].map(([line, messages]) => (
          <li key={line} className="flex gap-3 px-3 py-2 text-sm">
            <span className="w-20 shrink-0 font-semibold tabular-nums">{unit} {line}</span>
            <ul className="min-w-0 space-y-0.5">{messages.map((m, i) => <li key={i} className="break-words">{m}</li>)}</ul>
          </li>
        ))}
      </ol>
      {report.problemsLeftOut > 0 ? <p className="border-t border-rule px-3 py-2 text-sm text-ink-soft">… and {report.problemsLeftOut.toLocaleString("en")} more problems not listed. Correct these first and check the file again.</p> : null}
    </section>
  );
}
