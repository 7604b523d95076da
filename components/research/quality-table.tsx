import type { Metric } from "@/lib/quality";

const shown = (m: Metric) =>
  m.value === null ? "not recorded" : m.denominator === null ? String(m.value) : `${(m.value * 100).toFixed(0)}% (${m.numerator}/${m.denominator})`;
const target = (m: Metric) => `${m.comparator} ${m.denominator === null ? m.threshold : `${m.threshold * 100}%`}`;

/** One row per examiner (and the site), one column per metric; met/not met is written out, not only coloured. */
export function QualityTable({ groups }: { groups: { label: string; metrics: Metric[] }[] }) {
  const head = groups[0]?.metrics ?? [];
  return (
    <div className="mt-2 overflow-x-auto rounded-lg border border-rule bg-panel">
      <table className="w-full border-collapse text-left text-sm">
        <thead className="border-b border-rule bg-lagoon-50">
          <tr>
            <th className="px-3 py-2">Examiner</th>
            {head.map((m) => <th key={m.key} className="px-3 py-2">{m.label}<div className="font-normal text-ink-soft">target {target(m)}</div></th>)}
          </tr>
        </thead>
        <tbody>
          {groups.map((g) => (
            <tr key={g.label} className="border-b border-rule last:border-0">
              <th scope="row" className="px-3 py-2 font-semibold">{g.label}</th>
              {g.metrics.map((m) => (
                <td key={m.key} className="px-3 py-2 tabular-nums">
                  <div>{shown(m)}</div>
                  <div className={m.met === null ? "text-ink-soft" : m.met ? "font-semibold text-ok-ink" : "font-semibold text-danger-ink"}>
                    {m.met === null ? "–" : m.met ? "✓ meets" : "✗ misses target"}
                  </div>
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
