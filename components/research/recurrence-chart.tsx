"use client";

import { CartesianGrid, Line, LineChart, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";

export interface CurvePoint {
  time: number;
  survival: number;
}

/**
 * Kaplan–Meier curve of staying free of HSIL after clearance (lib/stats), drawn as a step
 * function, with the numbers still at risk under the time axis.
 */
export function RecurrenceChart({ points, ticks, atRisk }: { points: CurvePoint[]; ticks: number[]; atRisk: number[] }) {
  if (points.length === 0) return <p className="text-sm text-ink-soft">No patient has cleared after treatment yet, so there is no curve to draw.</p>;
  const last = ticks[ticks.length - 1] ?? 0;
  // Extend the last step to the end of follow-up so the curve does not stop at the last event.
  const data = [...points, { time: Math.max(last, points[points.length - 1]!.time), survival: points[points.length - 1]!.survival }];
  return (
    <figure>
      <div className="h-72 w-full">
        <ResponsiveContainer>
          <LineChart data={data} margin={{ top: 8, right: 24, bottom: 8, left: 0 }}>
            <CartesianGrid stroke="var(--color-rule)" />
            <XAxis dataKey="time" type="number" domain={[0, last || "dataMax"]} ticks={ticks} tick={{ fontSize: 12 }} label={{ value: "Days since clearance", position: "insideBottom", offset: -4, fontSize: 12 }} />
            <YAxis domain={[0, 1]} tickFormatter={(v: number) => `${Math.round(v * 100)}%`} tick={{ fontSize: 12 }} />
            <Tooltip formatter={(v) => `${(Number(v) * 100).toFixed(1)}%`} labelFormatter={(t) => `Day ${t}`} />
            <Line type="stepAfter" dataKey="survival" name="Free of HSIL" stroke="var(--color-lagoon-700)" strokeWidth={2.5} dot={false} isAnimationActive={false} />
          </LineChart>
        </ResponsiveContainer>
      </div>
      <table className="mt-1 w-full text-sm tabular-nums" aria-label="Numbers at risk">
        <tbody>
          <tr><th scope="row" className="pr-3 text-left font-semibold">Day</th>{ticks.map((t) => <td key={t} className="text-right">{t}</td>)}</tr>
          <tr><th scope="row" className="pr-3 text-left font-semibold">At risk</th>{atRisk.map((n, i) => <td key={ticks[i]} className="text-right">{n}</td>)}</tr>
        </tbody>
      </table>
    </figure>
  );
}
