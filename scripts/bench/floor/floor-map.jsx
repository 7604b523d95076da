// The canal-map floor: a bare React page drawing the same 200 lesions as d3-shape arcs, with the
// two interactions the bench times in the real editor: tap one (it becomes the selection) and
// turn the whole drawing (every arc recomputed, like switching the clock numbering).
// Not part of the app; bundled by scripts/bench/map-bench.mjs into a temp folder.
import { useMemo, useState } from "react";
import { createRoot } from "react-dom/client";
import { arc } from "d3-shape";

const GRADE_FILL = ["#d9e6f2", "#c9e3cf", "#f3e3b5", "#efc2b3", "#d7b5e6"];
const N = 200;
const lesions = Array.from({ length: N }, (_, i) => {
  const start = (i * 0.37) % 12;
  const from = -2 + (i % 9);
  return { id: `f${i}`, startH: start, endH: start + 0.2 + (i % 5) * 0.3, fromCm: from, toCm: from + 0.5 + (i % 3) * 0.5, grade: i % 5 };
});
const rOf = (cm) => 60 + (cm + 5) * 14;
const gen = arc();

function Map() {
  const [selected, setSelected] = useState(null);
  const [turnH, setTurnH] = useState(0);
  const paths = useMemo(
    () => lesions.map((l) => {
      const a0 = ((l.startH + turnH) / 12) * 2 * Math.PI;
      const a1 = ((l.endH + turnH) / 12) * 2 * Math.PI;
      return { l, d: gen({ innerRadius: rOf(l.fromCm), outerRadius: rOf(l.toCm), startAngle: a0, endAngle: a1 }) };
    }),
    [turnH],
  );
  return (
    <div>
      <button id="turn" type="button" onClick={() => setTurnH((t) => (t + 6) % 12)}>Turn</button>
      <svg viewBox="-320 -320 640 640" style={{ width: 640, height: 640 }}>
        <circle r={300} fill="none" stroke="#888" />
        {paths.map(({ l, d }) => (
          <path key={l.id} data-lesion-id={l.id} d={d} fill={GRADE_FILL[l.grade]} stroke={l.id === selected ? "#000" : "#555"} strokeWidth={l.id === selected ? 4 : 1.5} onPointerDown={() => setSelected(l.id)} />
        ))}
      </svg>
      <p>{selected ? `Selected ${selected}` : "Nothing selected"}</p>
    </div>
  );
}

createRoot(document.getElementById("root")).render(<Map />);
