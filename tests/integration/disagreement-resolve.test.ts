import { beforeAll, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { adjudications, auditEvents, visits } from "@/db/schema";
import { POST as createLesion } from "@/app/api/visits/[visitId]/lesions/route";
import { GET as patientReviews, POST as requestReview } from "@/app/api/patients/[patientId]/reviews/route";
import { PUT as adjudicate } from "@/app/api/reviews/[reviewId]/adjudications/route";
import { POST as resolve } from "@/app/api/adjudications/[adjudicationId]/resolve/route";
import { actor, ctx, makePatient, makeSite, req, type Actor } from "../fixtures/factory";

// Resolving a reviewer's disagreement records which status stands, who settled it and when; the
// record keeps it (listed as resolved) and the audit trail says the same.
let siteId: string;
let clinician: Actor, reviewer: Actor;

beforeAll(async () => {
  siteId = (await makeSite()).id;
  clinician = await actor("clinician", [siteId]);
  reviewer = await actor("reviewer", [siteId]);
});

async function disagreement() {
  const patientId = (await makePatient(siteId)).id;
  const [v] = await db.insert(visits).values({ patientId, siteId, visitDate: "2025-02-01", examinerId: clinician.userId, status: "draft" }).returning();
  const { lesion } = await (await createLesion(req("POST", "/x", clinician, { clockStartH: 3, clockEndH: 4, distanceStartCm: 1, distanceEndCm: 2, grade: "hsil" }), ctx({ visitId: v!.id }))).json();
  const { review } = await (await requestReview(req("POST", "/x", clinician, { visitId: v!.id, reviewerId: reviewer.userId }), ctx({ patientId }))).json();
  const { adjudication } = await (await adjudicate(req("PUT", "/x", reviewer, { trackId: lesion.trackId, verdict: "disagree", proposedStatus: "persistent", comment: "Same site as before." }), ctx({ reviewId: review.id }))).json();
  return { patientId, adjudicationId: adjudication.id as string };
}
const resolveAs = (who: Actor, id: string, body?: unknown) => resolve(req("POST", "/x", who, body), ctx({ adjudicationId: id }));

describe("resolving a reviewer's disagreement", () => {
  it("needs an outcome, records it with who and when, audits it, and lists it as resolved", async () => {
    const { patientId, adjudicationId } = await disagreement();
    const none = await resolveAs(clinician, adjudicationId, {});
    expect(none.status).toBe(400);
    expect((await none.json()).error.fields.outcome).toEqual(["Choose which status stands."]);
    expect((await db.select().from(adjudications).where(eq(adjudications.id, adjudicationId)))[0]!.resolvedAt).toBeNull();
    expect((await resolveAs(reviewer, adjudicationId, { outcome: "recorded_kept" })).status).toBe(403);

    const ok = await resolveAs(clinician, adjudicationId, { outcome: "proposed_accepted", note: "Linked to the earlier track; status now persistent." });
    expect(ok.status).toBe(200);
    const [row] = await db.select().from(adjudications).where(eq(adjudications.id, adjudicationId));
    expect(row).toMatchObject({ outcome: "proposed_accepted", outcomeNote: "Linked to the earlier track; status now persistent.", resolvedBy: clinician.userId });
    expect(row!.resolvedAt).toBeInstanceOf(Date);
    const [audit] = await db.select().from(auditEvents).where(and(eq(auditEvents.entityId, adjudicationId), eq(auditEvents.action, "review.resolve")));
    expect(audit).toMatchObject({ userId: clinician.userId, patientId, detail: { outcome: "proposed_accepted", proposedStatus: "persistent" } });

    const listed = await (await patientReviews(req("GET", "/x", clinician), ctx({ patientId }))).json();
    expect(listed.openDisagreements).toEqual([]);
    expect(listed.resolvedDisagreements).toEqual([expect.objectContaining({ id: adjudicationId, outcome: "proposed_accepted", resolvedBy: "Test clinician", proposedStatus: "persistent" })]);

    // Settled once: a second resolution is refused and changes nothing.
    expect((await resolveAs(clinician, adjudicationId, { outcome: "recorded_kept" })).status).toBe(409);
    expect((await db.select().from(adjudications).where(eq(adjudications.id, adjudicationId)))[0]!.outcome).toBe("proposed_accepted");
  });
});
