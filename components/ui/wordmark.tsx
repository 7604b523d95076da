/** Our mark: a ring with twelve ticks, the longest at 12 o'clock. */
export function Mark({ size = 28 }: { size?: number }) {
  const ticks = Array.from({ length: 12 }, (_, i) => {
    const a = (i * Math.PI) / 6;
    const inner = i === 0 ? 5 : 8;
    return (
      <line key={i} x1={16 + inner * Math.sin(a)} y1={16 - inner * Math.cos(a)} x2={16 + 11 * Math.sin(a)} y2={16 - 11 * Math.cos(a)}
        stroke="currentColor" strokeWidth={i % 3 === 0 ? 2.2 : 1.2} strokeLinecap="round" />
    );
  });
  return (
    <svg width={size} height={size} viewBox="0 0 32 32" aria-hidden="true" className="text-lagoon-600">
      <circle cx="16" cy="16" r="14" fill="none" stroke="currentColor" strokeWidth="2" />
      {ticks}
    </svg>
  );
}

export function Wordmark() {
  return (
    <span className="inline-flex items-center gap-2 text-xl font-bold tracking-tight text-ink">
      <Mark />
      Dentate
    </span>
  );
}
