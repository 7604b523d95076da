import { GRADES, type Grade } from "@/lib/domain/vocab";
import { GRADE_ENCODING } from "@/lib/map/encoding";

/** Pattern id for a grade under a prefix (one prefix per SVG, so ids never clash on a page). */
export function patternId(prefix: string, grade: Grade): string {
  return `${prefix}-fill-${grade}`;
}

/** One grade's fill: a paper base (so the zone bands never show through), a tint, a texture. */
export function GradePattern({ id, grade }: { id: string; grade: Grade }) {
  const enc = GRADE_ENCODING[grade];
  const base = <rect width="100%" height="100%" fill="var(--color-panel)" />;
  switch (enc.pattern) {
    case "open":
      return (
        <pattern id={id} patternUnits="userSpaceOnUse" width="8" height="8">
          <rect width="8" height="8" fill={enc.hue} fillOpacity={0.1} />
        </pattern>
      );
    case "bands":
    case "hatch":
    case "bars": {
      // One line per tile, turned to the texture's angle: parallel lines, never dots or a grid.
      const { angleDeg, spacing, width } = enc.lines!;
      const mid = spacing / 2;
      return (
        <pattern id={id} patternUnits="userSpaceOnUse" width={spacing} height={spacing} patternTransform={`rotate(${angleDeg})`}>
          {base}
          <rect width={spacing} height={spacing} fill={enc.hue} fillOpacity={0.2} />
          <line x1="0" y1={mid} x2={spacing} y2={mid} stroke={enc.strokeHue} strokeWidth={width} />
        </pattern>
      );
    }
    case "solid":
      return (
        <pattern id={id} patternUnits="userSpaceOnUse" width="4" height="4">
          <rect width="4" height="4" fill={enc.hue} />
        </pattern>
      );
  }
}

/** Every grade's pattern, for one SVG's <defs>. */
export function GradePatternDefs({ prefix }: { prefix: string }) {
  return (
    <>
      {GRADES.map((g) => (
        <GradePattern key={g} id={patternId(prefix, g)} grade={g} />
      ))}
    </>
  );
}

/** useId() output made safe for url(#…) references. */
export function safeId(raw: string): string {
  return `dn${raw.replace(/[^a-zA-Z0-9_-]/g, "")}`;
}
