"use client";
// The sections of the visit record beside the map, one at a time, so that on a tablet the map
// and the section in hand are in view together. Every section stays mounted while hidden: a
// half-typed dose or specimen survives a look at another section.
import { useId, useRef, useState, type KeyboardEvent, type ReactNode } from "react";

export interface SideTab {
  id: string;
  label: string;
  content: ReactNode;
}

export function SideTabs({ tabs, label }: { tabs: readonly SideTab[]; label: string }) {
  const [active, setActive] = useState(tabs[0]?.id ?? "");
  const base = useId();
  const refs = useRef<Record<string, HTMLButtonElement | null>>({});
  if (tabs.length === 1) return <>{tabs[0]!.content}</>;
  // Arrow keys move between tabs (WAI-ARIA Authoring Practices, tabs pattern).
  const onKey = (e: KeyboardEvent, i: number) => {
    const step = e.key === "ArrowRight" ? 1 : e.key === "ArrowLeft" ? -1 : 0;
    if (!step) return;
    e.preventDefault();
    const next = tabs[(i + step + tabs.length) % tabs.length]!;
    setActive(next.id);
    refs.current[next.id]?.focus();
  };
  return (
    <div className="flex min-w-0 flex-col gap-2">
      <div role="tablist" aria-label={label} className="flex flex-wrap gap-1 rounded-lg border border-rule bg-panel p-1">
        {tabs.map((t, i) => (
          <button
            key={t.id}
            ref={(el) => { refs.current[t.id] = el; }}
            type="button"
            role="tab"
            id={`${base}-tab-${t.id}`}
            aria-selected={active === t.id}
            aria-controls={`${base}-panel-${t.id}`}
            tabIndex={active === t.id ? 0 : -1}
            onClick={() => setActive(t.id)}
            onKeyDown={(e) => onKey(e, i)}
            className={`min-h-11 flex-1 rounded-md px-3 text-sm font-semibold ${active === t.id ? "bg-lagoon-600 text-white" : "text-ink hover:bg-lagoon-50"}`}
          >
            {t.label}
          </button>
        ))}
      </div>
      {tabs.map((t) => (
        <div key={t.id} role="tabpanel" id={`${base}-panel-${t.id}`} aria-labelledby={`${base}-tab-${t.id}`} hidden={active !== t.id} className="min-w-0">
          {t.content}
        </div>
      ))}
    </div>
  );
}
