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
    case "stipple":
      return (
        <pattern id={id} patternUnits="userSpaceOnUse" width="9" height="9">
          {base}
          <rect width="9" height="9" fill={enc.hue} fillOpacity={0.16} />
          <circle cx="2.25" cy="2.25" r="1.6" fill={enc.strokeHue} />
          <circle cx="6.75" cy="6.75" r="1.6" fill={enc.strokeHue} />
        </pattern>
      );
    case "hatch":
      return (
        <pattern id={id} patternUnits="userSpaceOnUse" width="10" height="10" patternTransform="rotate(45)">
          {base}
          <rect width="10" height="10" fill={enc.hue} fillOpacity={0.2} />
          <line x1="0" y1="5" x2="10" y2="5" stroke={enc.strokeHue} strokeWidth="2" />
        </pattern>
      );
    case "crosshatch":
      return (
        <pattern id={id} patternUnits="userSpaceOnUse" width="6" height="6" patternTransform="rotate(45)">
          {base}
          <rect width="6" height="6" fill={enc.hue} fillOpacity={0.3} />
          <line x1="0" y1="3" x2="6" y2="3" stroke={enc.strokeHue} strokeWidth="1.6" />
          <line x1="3" y1="0" x2="3" y2="6" stroke={enc.strokeHue} strokeWidth="1.6" />
        </pattern>
      );
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
