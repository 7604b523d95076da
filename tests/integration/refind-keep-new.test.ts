import { beforeAll, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { auditEvents, keptNewLesions, visits } from "@/db/schema";
import { POST as createLesion } from "@/app/api/visits/[visitId]/lesions/route";
import { GET as followUp, POST as trackAction } from "@/app/api/visits/[visitId]/tracks/route";
import { actor, ctx, makePatient, makeSite, req, type Actor } from "../fixtures/factory";

// "Keep as new": a lesion drawn fresh at a follow-up visit is decided to be a new lesion rather
// than an earlier track found again. The decision is stored, so it survives a reload and every
// examiner who opens the visit sees it.
let siteId: string;
let examiner: Actor, colleague: Actor, nurse: Actor;

beforeAll(async () => {
  siteId = (await makeSite()).id;
  examiner = await actor("clinician", [siteId]);
  colleague = await actor("clinician", [siteId]);
  nurse = await actor("research_nurse", [siteId]);
});

async function visit(patientId: string, date: string) {
  const [v] = await db.insert(visits).values({ patientId, siteId, visitDate: date, examinerId: examiner.userId, status: "draft" }).returning();
  return v!.id;
}
const L = (startH: number, endH: number) => ({ clockStartH: startH, clockEndH: endH, distanceStartCm: 1, distanceEndCm: 2, grade: "lsil" });
const draw = async (visitId: string, startH: number, endH: number) => (await (await createLesion(req("POST", "/x", examiner, L(startH, endH)), ctx({ visitId }))).json()).lesion as { id: string; trackId: string };
const context = async (who: Actor, visitId: string) => (await followUp(req("GET", "/x", who), ctx({ visitId }))).json();
const act = (who: Actor, visitId: string, body: unknown) => trackAction(req("POST", "/x", who, body), ctx({ visitId }));

describe("keep a fresh lesion as new", () => {
  it("is stored, seen by another examiner, audited, and undone by a link or by undo", async () => {
    const patientId = (await makePatient(siteId)).id;
    const v1 = await visit(patientId, "2025-01-10");
    const earlier = await draw(v1, 3, 4);
    await db.update(visits).set({ status: "signed" }).where(eq(visits.id, v1));
    const v2 = await visit(patientId, "2025-07-10");
    const fresh = await draw(v2, 3, 4.5);
    expect((await context(examiner, v2)).suggestions).toEqual([expect.objectContaining({ lesionId: fresh.id, trackId: earlier.trackId })]);

    const kept = await act(examiner, v2, { action: "keep_new", lesionId: fresh.id });
    expect(kept.status).toBe(200);
    // Another examiner opening the visit (a fresh read) sees the decision and no suggestion for it.
    const seen = await context(colleague, v2);
    expect(seen.suggestions).toEqual([]);
    expect(seen.unmatchedLesionIds).toEqual([]);
    expect(seen.keptNew).toEqual([{ lesionId: fresh.id, decidedBy: "Test clinician", decidedAt: expect.stringMatching(/^\d{4}-\d\d-\d\dT/) }]);
    const [row] = await db.select().from(keptNewLesions).where(eq(keptNewLesions.lesionId, fresh.id));
    expect(row).toMatchObject({ visitId: v2, siteId, decidedBy: examiner.userId });
    const audit = await db.select().from(auditEvents).where(and(eq(auditEvents.entityId, v2), eq(auditEvents.action, "track.keep_new")));
    expect(audit).toHaveLength(1);
    expect(audit[0]).toMatchObject({ userId: examiner.userId, patientId, detail: { action: "keep_new", lesionId: fresh.id } });

    // Undo offers it again; a later link to the earlier track removes the decision as well.
    expect((await act(colleague, v2, { action: "unkeep_new", lesionId: fresh.id })).status).toBe(200);
    expect((await context(examiner, v2)).suggestions).toHaveLength(1);
    await act(examiner, v2, { action: "keep_new", lesionId: fresh.id });
    expect((await act(examiner, v2, { action: "link", lesionId: fresh.id, trackId: earlier.trackId })).status).toBe(200);
    expect(await db.select().from(keptNewLesions).where(eq(keptNewLesions.lesionId, fresh.id))).toEqual([]);
    expect((await context(examiner, v2)).keptNew).toEqual([]);
  });

  it("refuses a nurse, a lesion of another visit, and a signed visit, writing nothing", async () => {
    const patientId = (await makePatient(siteId)).id;
    const v1 = await visit(patientId, "2025-01-10");
    const old = await draw(v1, 3, 4);
    await db.update(visits).set({ status: "signed" }).where(eq(visits.id, v1));
    const v2 = await visit(patientId, "2025-07-10");
    const fresh = await draw(v2, 8, 9);
    expect((await act(nurse, v2, { action: "keep_new", lesionId: fresh.id })).status).toBe(403);
    const wrong = await act(examiner, v2, { action: "keep_new", lesionId: old.id });
    expect(wrong.status).toBe(400);
    expect((await wrong.json()).error.fields.lesionId).toBeDefined();
    expect((await act(examiner, v2, { action: "keep_new", lesionId: "not-an-id" })).status).toBe(400);
    await db.update(visits).set({ status: "signed" }).where(eq(visits.id, v2));
    expect((await act(examiner, v2, { action: "keep_new", lesionId: fresh.id })).status).toBe(423);
    expect(await db.select().from(keptNewLesions).where(eq(keptNewLesions.visitId, v2))).toEqual([]);
  });
});
