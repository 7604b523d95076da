"use client";

import { useId } from "react";
import { Bar, CartesianGrid, ComposedChart, Legend, Line, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import { GRADE_ENCODING } from "@/components/canal-map";
import { GradePattern, patternId, safeId } from "@/components/canal-map/patterns";
import { GRADES, type Grade } from "@/lib/domain/vocab";
import type { Timeline } from "./timeline-types";

const TREATED_KEY = "treatedPct";
const TREATED_NAME = "Treated circumference (%)";

/** Rows for the chart: one per visit, oldest first, a count per grade and the treated share in %. */
export function chartRows(t: Timeline) {
  return t.perVisit.map((p) => {
    const row: Record<string, string | number> = { visitDate: p.visitDate };
    for (const g of GRADES) row[g] = p.countsByGrade[g] ?? 0;
    row[TREATED_KEY] = Math.round(p.treatedFraction * 1000) / 10;
    return row;
  });
}

/**
 * Lesion counts by grade (stacked bars, same fill patterns and outlines as the map legend) and
 * the treated share of the circumference (a line on the right-hand axis, in %). A table with
 * the same numbers follows for screen readers and for print.
 */
export function VisitGradeChart({ timeline }: { timeline: Timeline }) {
  const prefix = safeId(useId());
  const rows = chartRows(timeline);
  return (
    <figure className="rounded-lg border border-rule bg-panel p-3">
      <figcaption className="font-bold">Lesions by grade and treated circumference, by visit</figcaption>
      <div className="mt-2 h-72 w-full print:h-64" aria-hidden="true">
        <ResponsiveContainer width="100%" height="100%">
          <ComposedChart accessibilityLayer={false} data={rows} margin={{ top: 8, right: 16, bottom: 8, left: 0 }}>
            <defs>
              {GRADES.map((g) => (
                <GradePattern key={g} id={patternId(prefix, g)} grade={g} />
              ))}
            </defs>
            <CartesianGrid stroke="var(--color-rule)" vertical={false} />
            <XAxis dataKey="visitDate" tick={{ fill: "var(--color-ink)", fontSize: 12 }} />
            <YAxis yAxisId="count" allowDecimals={false} tick={{ fill: "var(--color-ink)", fontSize: 12 }} label={{ value: "Lesions", angle: -90, position: "insideLeft", fill: "var(--color-ink)" }} />
            <YAxis yAxisId="pct" orientation="right" domain={[0, 100]} unit="%" tick={{ fill: "var(--color-ink)", fontSize: 12 }} label={{ value: "Treated %", angle: 90, position: "insideRight", fill: "var(--color-ink)" }} />
            <Tooltip />
            <Legend itemSorter={null} formatter={(value: string) => <span className="text-sm text-ink">{value}</span>} />
            {GRADES.map((g: Grade) => {
              const enc = GRADE_ENCODING[g];
              return (
                <Bar key={g} yAxisId="count" dataKey={g} name={`${enc.label} (${enc.words})`} stackId="grades" fill={`url(#${patternId(prefix, g)})`}
                  stroke={enc.strokeHue} strokeWidth={Math.min(enc.outlineWidth, 2.5)} strokeDasharray={enc.outlineDash} isAnimationActive={false} />
              );
            })}
            <Line yAxisId="pct" dataKey={TREATED_KEY} name={TREATED_NAME} type="linear" stroke="var(--color-ink)" strokeWidth={2} strokeDasharray="8 4"
              dot={{ r: 4, fill: "var(--color-panel)", stroke: "var(--color-ink)", strokeWidth: 2 }} isAnimationActive={false} />
          </ComposedChart>
        </ResponsiveContainer>
      </div>
      <table className="sr-only">
        <caption>Lesion counts by grade and treated circumference per visit</caption>
        <thead>
          <tr><th scope="col">Visit</th>{GRADES.map((g) => <th key={g} scope="col">{GRADE_ENCODING[g].label}</th>)}<th scope="col">{TREATED_NAME}</th></tr>
        </thead>
        <tbody>
          {rows.map((r, i) => (
            <tr key={i}><th scope="row">{r.visitDate}</th>{GRADES.map((g) => <td key={g}>{r[g]}</td>)}<td>{r[TREATED_KEY]}%</td></tr>
          ))}
        </tbody>
      </table>
    </figure>
  );
}
