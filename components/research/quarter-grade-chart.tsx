"use client";

import { useId } from "react";
import { Bar, BarChart, CartesianGrid, Legend, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import { GradePattern, patternId, safeId } from "@/components/canal-map/patterns";
import { GRADE_ENCODING } from "@/lib/map/encoding";
import { GRADE_LABEL, GRADES, type Grade } from "@/lib/domain/vocab";

export type QuarterRow = { quarter: string } & Record<Grade, number>;

/** Lesions seen per quarter, stacked by impression grade; the table below carries the same figures for greyscale and screen readers. */
// Fills, outlines and hues come from the map's encoding, so the chart reads in greyscale as the map does.
export function QuarterGradeChart({ rows, emptyQuarters = [] }: { rows: QuarterRow[]; emptyQuarters?: readonly string[] }) {
  const prefix = safeId(useId());
  if (rows.length === 0) return <p className="text-sm text-ink-soft">No lesions recorded at signed visits yet.</p>;
  return (
    <figure>
      <div className="h-72 w-full">
        <ResponsiveContainer>
          <BarChart data={rows} margin={{ top: 8, right: 16, bottom: 8, left: 0 }}>
            <defs>{GRADES.map((g) => <GradePattern key={g} id={patternId(prefix, g)} grade={g} />)}</defs>
            <CartesianGrid stroke="var(--color-rule)" vertical={false} />
            <XAxis dataKey="quarter" tick={{ fontSize: 12 }} />
            <YAxis allowDecimals={false} tick={{ fontSize: 12 }} />
            <Tooltip />
            <Legend />
            {GRADES.map((g) => (
              <Bar key={g} dataKey={g} name={`${GRADE_ENCODING[g].label} (${GRADE_ENCODING[g].words})`} stackId="grade" fill={`url(#${patternId(prefix, g)})`}
                stroke={GRADE_ENCODING[g].strokeHue} strokeWidth={Math.min(GRADE_ENCODING[g].outlineWidth, 2.5)} strokeDasharray={GRADE_ENCODING[g].outlineDash} isAnimationActive={false} />
            ))}
          </BarChart>
        </ResponsiveContainer>
      </div>
      {emptyQuarters.length ? (
        <p className="mt-1 text-sm" data-empty-quarters="">
          No lesions at signed visits in {emptyQuarters.join(", ")}: {emptyQuarters.length === 1 ? "that quarter is" : "those quarters are"} shown empty, not left out.
        </p>
      ) : null}
      <details className="mt-2 text-sm">
        <summary className="cursor-pointer font-semibold text-lagoon-700">Figures as a table</summary>
        <table className="mt-2 w-full text-left tabular-nums">
          <thead><tr><th className="pr-3">Quarter</th>{GRADES.map((g) => <th key={g} className="pr-3 text-right">{GRADE_LABEL[g]}</th>)}</tr></thead>
          <tbody>{rows.map((r) => <tr key={r.quarter}><td className="pr-3">{r.quarter}</td>{GRADES.map((g) => <td key={g} className="pr-3 text-right">{r[g]}</td>)}</tr>)}</tbody>
        </table>
      </details>
    </figure>
  );
}
