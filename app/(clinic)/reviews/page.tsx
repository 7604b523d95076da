import { AppShell } from "@/components/shell/app-shell";
import { ReviewsForMe } from "@/components/review/reviews-for-me";
import { listOpenReviewsForReviewer } from "@/db/queries/reviews";
import { recordAudit } from "@/lib/server/audit";
import { scopeOf } from "@/lib/auth/guard";
import { requirePageRole, pageClientIp } from "@/lib/auth/page-guard";

export const metadata = { title: "Reviews for me" };

/** The signed-in reviewer's reviews still to do. */
export default async function ReviewsForMePage() {
  const user = await requirePageRole(["reviewer"]);
  const rows = await listOpenReviewsForReviewer(scopeOf(user));
  await recordAudit({ userId: user.id, ip: await pageClientIp(), action: "reviews.viewed", detail: { patientIds: [...new Set(rows.map((r) => r.patientId))] } });
  return (
    <AppShell user={user}>
      <h1 className="text-2xl font-bold">Reviews for me</h1>
      <p className="mt-1 text-sm text-ink-soft">Reviews asked of you and not yet signed off. Each opens on the two visits it was asked for.</p>
      <ReviewsForMe rows={rows.map((r) => ({ ...r, requestedAt: r.requestedAt.toISOString() }))} />
    </AppShell>
  );
}
