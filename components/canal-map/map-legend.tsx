import { useId } from "react";
import { GRADES } from "@/lib/domain/vocab";
import { BIOPSY_TAG, GHOST_MARK, GRADE_ENCODING, ORIENTATION_NOTE, TREATED_MARK, TREATED_RING, UNSAVED_MARK, ZONE_ENCODING } from "@/lib/map/encoding";
import { GradePattern, safeId } from "./patterns";

const SWATCH = "M3 25 L3 9 Q20 -1 37 9 L37 25 Q20 17 3 25 Z";

function Swatch({ children }: { children: React.ReactNode }) {
  return (
    <svg width="40" height="28" viewBox="0 0 40 28" aria-hidden="true" className="shrink-0">
      {children}
    </svg>
  );
}

/** The key to the map, drawn from the same encoding module as the map itself. */
export function MapLegend({ showGhosts = false, compact = false }: { showGhosts?: boolean; compact?: boolean }) {
  const prefix = safeId(useId());
  return (
    <section aria-label="Map legend" className="rounded-lg border border-rule bg-panel p-3 text-sm">
      <h2 className="font-bold">Legend</h2>
      <ul className={`mt-2 grid gap-x-4 gap-y-1 ${compact ? "grid-cols-2" : "grid-cols-1 sm:grid-cols-2 lg:grid-cols-3"}`}>
        {GRADES.map((g) => {
          const enc = GRADE_ENCODING[g];
          const id = `${prefix}-${g}`;
          return (
            <li key={g} className="flex items-center gap-2">
              <Swatch>
                <defs><GradePattern id={id} grade={g} /></defs>
                <path d={SWATCH} fill={`url(#${id})`} stroke={enc.strokeHue} strokeWidth={Math.min(enc.outlineWidth, 4)} strokeDasharray={enc.outlineDash} strokeLinecap="round" />
                {enc.doubleOutline ? <path d={SWATCH} fill="none" stroke="var(--color-paper)" strokeWidth={1.2} /> : null}
              </Swatch>
              <span><span className="font-semibold">{enc.label}</span> <span className="text-ink-soft">— {enc.words}</span></span>
            </li>
          );
        })}
        <li className="flex items-center gap-2">
          <Swatch>
            <path d={SWATCH} fill="none" stroke="var(--color-ink)" strokeWidth={TREATED_MARK.strokeWidth} strokeDasharray={TREATED_MARK.dash} />
            <circle cx={20} cy={13} r={TREATED_MARK.markRadius} fill="var(--color-panel)" stroke="var(--color-ink)" strokeWidth={2} />
            <circle cx={20} cy={13} r={2.2} fill="var(--color-ink)" />
          </Swatch>
          <span><span className="font-semibold">Treated</span> <span className="text-ink-soft">— {TREATED_MARK.words}</span></span>
        </li>
        <li className="flex items-center gap-2">
          <Swatch>
            <path d="M2 22 Q20 4 38 22" fill="none" stroke={TREATED_RING.stroke} strokeWidth={TREATED_RING.widthPx - 2} strokeDasharray={TREATED_RING.rung} />
            <path d="M2 22 Q20 4 38 22" fill="none" stroke={TREATED_RING.stroke} strokeWidth={TREATED_RING.rail} transform="translate(0 -5.5)" />
            <path d="M2 22 Q20 4 38 22" fill="none" stroke={TREATED_RING.stroke} strokeWidth={TREATED_RING.rail} transform="translate(0 5.5)" />
          </Swatch>
          <span><span className="font-semibold">Treated arc</span> <span className="text-ink-soft">— {TREATED_RING.words}</span></span>
        </li>
        <li className="flex items-center gap-2">
          <Swatch>
            <rect x={11} y={5} width={BIOPSY_TAG.size} height={BIOPSY_TAG.size} fill="var(--color-panel)" stroke="var(--color-ink)" strokeWidth={1.5} />
            <text x={20} y={19} textAnchor="middle" fontSize={13} fontWeight={700} fill="var(--color-ink)">A</text>
          </Swatch>
          <span><span className="font-semibold">Biopsied</span> <span className="text-ink-soft">— {BIOPSY_TAG.words}</span></span>
        </li>
        <li className="flex items-center gap-2">
          <Swatch>
            <path d={SWATCH} fill="none" stroke={UNSAVED_MARK.stroke} strokeWidth={UNSAVED_MARK.width} strokeDasharray={UNSAVED_MARK.dash} />
          </Swatch>
          <span className="text-ink-soft">{UNSAVED_MARK.words}</span>
        </li>
        {showGhosts ? (
          <li className="flex items-center gap-2">
            <Swatch>
              <path d={SWATCH} fill="none" stroke="var(--color-ink-soft)" strokeWidth={GHOST_MARK.strokeWidth} strokeDasharray={GHOST_MARK.dash} opacity={GHOST_MARK.opacity} />
            </Swatch>
            <span><span className="font-semibold">Previous visit</span> <span className="text-ink-soft">— {GHOST_MARK.words}</span></span>
          </li>
        ) : null}
      </ul>
      <h3 className="mt-3 font-semibold">Zones, outside in</h3>
      <ol className="mt-1 flex flex-wrap gap-x-4 gap-y-1">
        {ZONE_ENCODING.map((z) => (
          <li key={z.zone} className="flex items-center gap-2">
            <span aria-hidden="true" className="inline-block h-4 w-6 rounded-sm border border-rule-strong" style={{ background: z.fill }} />
            {z.label}
          </li>
        ))}
      </ol>
      <p className="mt-2 text-ink-soft">{ORIENTATION_NOTE}</p>
    </section>
  );
}
