import { beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import { adjudications, lesions, lesionTracks, mailOutbox, reviews, visits } from "@/db/schema";
import { listOpenReviewsForReviewer } from "@/db/queries/reviews";
import { POST as requestReview } from "@/app/api/patients/[patientId]/reviews/route";
import { PUT as adjudicate } from "@/app/api/reviews/[reviewId]/adjudications/route";
import { POST as signOff } from "@/app/api/reviews/[reviewId]/sign-off/route";
import { actor, ctx, makePatient, makeSite, req, type Actor } from "../fixtures/factory";

// A reviewer asked for a review must land on that review: the mail names the exact pair of
// visits, and "Reviews for me" lists what is waiting, each opening on its own pair.
let siteId: string, otherSite: string, clinician: Actor, reviewer: Actor, otherReviewer: Actor;
let patientId: string, earlier: string, later: string, trackId: string;

beforeAll(async () => {
  siteId = (await makeSite()).id;
  otherSite = (await makeSite()).id;
  clinician = await actor("clinician", [siteId]);
  reviewer = await actor("reviewer", [siteId]);
  otherReviewer = await actor("reviewer", [siteId]);
  patientId = (await makePatient(siteId)).id;
  const [a] = await db.insert(visits).values({ patientId, siteId, visitDate: "2025-03-01", examinerId: clinician.userId, status: "signed", signedAt: new Date() }).returning();
  const [b] = await db.insert(visits).values({ patientId, siteId, visitDate: "2025-09-01", examinerId: clinician.userId, status: "signed", signedAt: new Date() }).returning();
  // A third, later visit: a link without the pair would open the latest two (b and c) instead.
  await db.insert(visits).values({ patientId, siteId, visitDate: "2026-02-01", examinerId: clinician.userId });
  earlier = a!.id;
  later = b!.id;
  const [t] = await db.insert(lesionTracks).values({ patientId, siteId, label: "#1" }).returning();
  trackId = t!.id;
  await db.insert(lesions).values({ visitId: later, siteId, trackId, label: "L1", clockStartH: 1, clockEndH: 2, distanceStartCm: 1, distanceEndCm: 2, zone: "transformation_zone", grade: "hsil" });
});

async function ask(who: Actor) {
  const res = await requestReview(req("POST", "/x", clinician, { visitId: later, comparedVisitId: earlier, reviewerId: who.userId }), ctx({ patientId }));
  expect(res.status).toBe(201);
  return (await res.json()).review.id as string;
}

describe("reviews for me", () => {
  it("the review mail links the compare page on the exact pair asked for", async () => {
    const id = await ask(reviewer);
    const [mail] = await db.select().from(mailOutbox).where(eq(mailOutbox.idempotencyKey, `review-requested:${id}`));
    expect(mail!.textBody).toContain(`/patients/${patientId}/compare?a=${earlier}&b=${later}`);
  });

  it("lists the reviewer's open reviews only: not another reviewer's, not a signed-off one, not another site's", async () => {
    const mine = await ask(reviewer);
    const theirs = await ask(otherReviewer);
    const done = await ask(reviewer);
    expect((await adjudicate(req("PUT", "/x", reviewer, { trackId, verdict: "agree" }), ctx({ reviewId: done }))).status).toBe(200);
    expect((await signOff(req("POST", "/x", reviewer), ctx({ reviewId: done }))).status).toBe(200);
    const rows = await listOpenReviewsForReviewer({ userId: reviewer.userId, siteIds: [siteId] });
    const ids = rows.map((r) => r.id);
    expect(ids).toContain(mine);
    expect(ids).not.toContain(theirs);
    expect(ids).not.toContain(done);
    const row = rows.find((r) => r.id === mine)!;
    expect(row).toMatchObject({ visitId: later, comparedVisitId: earlier, visitDate: "2025-09-01", comparedVisitDate: "2025-03-01", status: "requested", verdicts: 0 });
    expect(await listOpenReviewsForReviewer({ userId: reviewer.userId, siteIds: [otherSite] })).toEqual([]);
  });

  it("a reviewer can say a track was not examined; it counts as a verdict and proposes no status", async () => {
    const id = await ask(reviewer);
    const res = await adjudicate(req("PUT", "/x", reviewer, { trackId, verdict: "not_examined", proposedStatus: "cleared" }), ctx({ reviewId: id }));
    expect(res.status).toBe(200);
    const [a] = await db.select().from(adjudications).where(eq(adjudications.reviewId, id));
    expect(a).toMatchObject({ verdict: "not_examined", proposedStatus: null });
    const [r] = await db.select({ status: reviews.status }).from(reviews).where(eq(reviews.id, id));
    expect(r!.status).toBe("in_progress");
  });
});
