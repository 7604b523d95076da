import { Caution } from "@/components/ui/caution";
import { GRADE_LABEL, TRACK_STATUSES } from "@/lib/domain/vocab";
import { StatusMark } from "./status-glyph";
import { timeSinceWords, type TimelineSummary } from "./timeline-summary";

/** Shown wherever a track's effective grade is suspected cancer on the impression alone (timeline and compare). */
export function SuspectedCancerCaution({ labels }: { labels: readonly string[] }) {
  if (!labels.length) return null;
  return (
    <Caution tone="danger" title={`Suspected cancer: ${labels.join(", ")}`}>
      This needs urgent histological confirmation according to your local protocol. The grade shown comes from the exam
      impression unless a biopsy result is recorded; the clinician decides what happens next.
    </Caution>
  );
}

/** Squamous cell carcinoma on histology: the diagnosis is made, so the caution is about referral. */
export function ConfirmedCancerCaution({ labels }: { labels: readonly string[] }) {
  if (!labels.length) return null;
  return (
    <Caution tone="danger" title={`Squamous cell carcinoma on histology: ${labels.join(", ")}`}>
      Confirmed by biopsy. Refer without delay to the team that treats anal cancer, following your local cancer pathway;
      office ablation of precancer is not its treatment. The clinician decides what happens next.
    </Caution>
  );
}

/** Both cautions, confirmed first; a track appears in one of them only. */
export function CancerCautions({ confirmed, suspected }: { confirmed: readonly string[]; suspected: readonly string[] }) {
  return (
    <>
      <ConfirmedCancerCaution labels={confirmed} />
      <SuspectedCancerCaution labels={suspected.filter((l) => !confirmed.includes(l))} />
    </>
  );
}

/** "3 months ago", "today", or, for a visit dated later than today, says so (never "… ago"). */
function SinceToday({ fromIso, todayIso }: { fromIso: string; todayIso: string }) {
  const since = timeSinceWords(fromIso, todayIso);
  if (since === null) return <span className="text-lg font-bold">Dated after today</span>;
  return (
    <>
      <span className="text-lg font-bold">{since}</span>
      {since === "today" ? "" : " ago"}
    </>
  );
}

export function SummaryPanel({ summary, todayIso }: { summary: TimelineSummary; todayIso: string }) {
  const { countsByStatus, lastHsilOrWorse, treated } = summary;
  return (
    <section aria-labelledby="summary-h" className="grid gap-4 rounded-lg border border-rule bg-panel p-4 md:grid-cols-3">
      <div>
        <h2 id="summary-h" className="font-bold">Tracks by current status</h2>
        <ul className="mt-1 space-y-0.5 text-sm">
          {TRACK_STATUSES.filter((s) => countsByStatus[s] > 0).map((s) => (
            <li key={s} className="flex items-center justify-between gap-3">
              <StatusMark status={s} />
              <span className="font-bold tabular-nums">{countsByStatus[s]}</span>
            </li>
          ))}
          {summary.current.length === 0 ? <li className="text-ink-soft">No tracks yet.</li> : null}
        </ul>
      </div>
      <div>
        <h2 className="font-bold">Last HSIL or worse</h2>
        {lastHsilOrWorse ? (
          <p className="mt-1 text-sm">
            <SinceToday fromIso={lastHsilOrWorse.visitDate} todayIso={todayIso} />
            <span className="block text-ink-soft">at the visit of {lastHsilOrWorse.visitDate}{lastHsilOrWorse.trackLabels.length ? ` (${lastHsilOrWorse.trackLabels.join(", ")})` : ""}; histology decides the grade where there is a result.</span>
          </p>
        ) : (
          <p className="mt-1 text-sm text-ink-soft">No HSIL or worse recorded.</p>
        )}
      </div>
      <div>
        <h2 className="font-bold">Treated sites</h2>
        {treated.length ? (
          <ul className="mt-1 space-y-0.5 text-sm">
            {treated.map((t) => {
              const now = summary.current.find((c) => c.trackId === t.trackId);
              return (
                <li key={t.trackId}>
                  <span className="font-bold">{t.label}</span> treated {t.visitDates.join(", ")}
                  {now ? <span className="text-ink-soft"> · now {now.status}{summary.confirmedCancer.includes(now.label) ? ", squamous cell carcinoma on histology" : now.effectiveGrade ? `, ${GRADE_LABEL[now.effectiveGrade]}` : ""}</span> : null}
                </li>
              );
            })}
          </ul>
        ) : (
          <p className="mt-1 text-sm text-ink-soft">No treatment recorded.</p>
        )}
      </div>
    </section>
  );
}
