import Link from "next/link";
import { compareHref } from "./review-model";

export interface ReviewForMe {
  id: string;
  status: "requested" | "in_progress" | "signed_off";
  requestedAt: string;
  patientId: string;
  visitId: string;
  comparedVisitId: string | null;
  mrn: string;
  familyName: string;
  givenName: string;
  visitDate: string;
  comparedVisitDate: string | null;
  requestedBy: string | null;
  verdicts: number;
}

/** Where a review opens: the compare page on the exact pair it was requested for. */
export function reviewHref(r: Pick<ReviewForMe, "patientId" | "visitId" | "comparedVisitId">): string {
  return r.comparedVisitId ? compareHref(r.patientId, r.comparedVisitId, r.visitId) : `/patients/${r.patientId}/compare?b=${r.visitId}`;
}

/** A reviewer's reviews still to do, each opening on its own pair of visits. */
export function ReviewsForMe({ rows }: { rows: readonly ReviewForMe[] }) {
  if (rows.length === 0) return <p className="mt-4 rounded-lg border border-rule bg-panel p-4">No review is waiting for you.</p>;
  const th = "px-3 py-2";
  return (
    <table className="mt-4 w-full border-collapse rounded-lg bg-panel text-left">
      <caption className="sr-only">Reviews waiting for you, oldest request first</caption>
      <thead className="border-b border-rule text-sm">
        <tr><th className={th}>Patient</th><th className={th}>MRN</th><th className={th}>Visits compared</th><th className={th}>Asked by</th><th className={th}>Asked on</th><th className={th}>Progress</th></tr>
      </thead>
      <tbody>
        {rows.map((r) => (
          <tr key={r.id} className="border-b border-rule last:border-0" data-review-id={r.id}>
            <td className={th}>
              <Link href={reviewHref(r)} className="inline-flex min-h-11 items-center font-semibold text-lagoon-700 underline">
                {r.familyName}, {r.givenName}
              </Link>
            </td>
            <td className={`${th} tabular-nums`}>{r.mrn}</td>
            <td className={`${th} tabular-nums`}>{r.comparedVisitDate ? `${r.comparedVisitDate} → ${r.visitDate}` : `${r.visitDate} (against the visit before)`}</td>
            <td className={th}>{r.requestedBy ?? "—"}</td>
            <td className={`${th} tabular-nums`}>{r.requestedAt.slice(0, 10)}</td>
            <td className={th}>{r.status === "requested" ? "Not started" : `Started, ${r.verdicts} ${r.verdicts === 1 ? "verdict" : "verdicts"}`}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
