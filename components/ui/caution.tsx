import type { ReactNode } from "react";

/** A caution says what, why, and that local protocol and the clinician decide. */
export function Caution({ tone = "caution", title, children }: { tone?: "caution" | "danger"; title: string; children?: ReactNode }) {
  const cls = tone === "danger" ? "border-danger-rule bg-danger-bg text-danger-ink" : "border-caution-rule bg-caution-bg text-caution-ink";
  return (
    <div role={tone === "danger" ? "alert" : "status"} className={`rounded-md border-l-4 px-3 py-2 text-sm ${cls}`}>
      <p className="font-bold">{tone === "danger" ? "⚠ " : "△ "}{title}</p>
      {children ? <div className="mt-1">{children}</div> : null}
    </div>
  );
}
