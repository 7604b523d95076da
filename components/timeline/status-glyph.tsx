import type { TrackStatus } from "@/lib/domain/vocab";

// Dentate's status marks: each status has its own SHAPE and its own word, drawn in ink, so a
// greyscale print or a colour-blind reader reads the grid as well as anyone. Colour stays
// reserved for grade and cautions, so that it keeps its meaning where it appears.

export const STATUS_LABEL: Record<TrackStatus, string> = {
  new: "New",
  persistent: "Persistent",
  regressed: "Regressed",
  progressed: "Progressed",
  cleared: "Cleared",
  recurrent: "Recurrent",
};

/** The shape in words, for the legend and for anyone describing a printout. */
export const STATUS_SHAPE_WORDS: Record<TrackStatus, string> = {
  new: "ring with a plus",
  persistent: "solid square",
  regressed: "open triangle pointing down",
  progressed: "solid triangle pointing up",
  cleared: "open ring",
  recurrent: "solid diamond with a ring round it",
};

const INK = "currentColor";

function Shape({ status }: { status: TrackStatus | null }) {
  switch (status) {
    case "new":
      return (
        <>
          <circle cx="8" cy="8" r="6" fill="none" stroke={INK} strokeWidth="1.6" />
          <path d="M8 4.5v7M4.5 8h7" stroke={INK} strokeWidth="1.6" />
        </>
      );
    case "persistent":
      return <rect x="2.5" y="2.5" width="11" height="11" fill={INK} />;
    case "regressed":
      return <path d="M2 3.5h12L8 13.5z" fill="none" stroke={INK} strokeWidth="1.6" strokeLinejoin="round" />;
    case "progressed":
      return <path d="M8 2.5l6 10H2z" fill={INK} />;
    case "cleared":
      return <circle cx="8" cy="8" r="5.5" fill="none" stroke={INK} strokeWidth="1.6" />;
    case "recurrent":
      return (
        <>
          <circle cx="8" cy="8" r="7" fill="none" stroke={INK} strokeWidth="1.1" />
          <path d="M8 3.2L12.8 8 8 12.8 3.2 8z" fill={INK} />
        </>
      );
    default:
      return <path d="M4 8h8" stroke={INK} strokeWidth="1.4" strokeDasharray="2 2" />;
  }
}

/** The mark alone; decorative, because the word always sits next to it. */
export function StatusGlyph({ status, size = 16 }: { status: TrackStatus | null; size?: number }) {
  return (
    <svg width={size} height={size} viewBox="0 0 16 16" aria-hidden="true" data-status-glyph={status ?? "none"} className="inline-block shrink-0 align-[-2px]">
      <Shape status={status} />
    </svg>
  );
}

/** Mark and word together: the form every status takes on screen and on paper. */
export function StatusMark({ status }: { status: TrackStatus | null }) {
  return (
    <span className="inline-flex items-center gap-1.5">
      <StatusGlyph status={status} />
      <span className="font-semibold">{status ? STATUS_LABEL[status] : "No record"}</span>
    </span>
  );
}

export function StatusLegend() {
  const all = Object.keys(STATUS_LABEL) as TrackStatus[];
  return (
    <ul aria-label="Status marks" className="flex flex-wrap gap-x-5 gap-y-1 text-sm">
      {all.map((s) => (
        <li key={s} className="inline-flex items-center gap-1.5">
          <StatusMark status={s} />
          <span className="text-ink-soft">— {STATUS_SHAPE_WORDS[s]}</span>
        </li>
      ))}
      <li className="inline-flex items-center gap-1.5">
        <StatusMark status={null} />
        <span className="text-ink-soft">— not yet seen, or not looked for</span>
      </li>
    </ul>
  );
}
