// Discarding a draft visit started by mistake: its examiner or an administrator, with a reason in
// words; it leaves the patient's visit list and timeline, the audit log keeps it; a signed visit is
// never discarded (423). A record once signed is closed (common practice, no source: corrections
// to a signed record go in an addendum).
import { beforeAll, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { db } from "@/db/client";
import * as s from "@/db/schema";
import { POST as discard } from "@/app/api/visits/[visitId]/discard/route";
import { GET as timeline } from "@/app/api/patients/[patientId]/timeline/route";
import { listVisitsForPatient } from "@/db/queries/patients";
import { actor, ctx, makePatient, makeSite, req, type Actor } from "../fixtures/factory";

let siteId: string, examiner: Actor, colleague: Actor, admin: Actor, patientId: string;

async function draftWithLesion(examinerId: string, status: "draft" | "signed" = "draft") {
  const [v] = await db.insert(s.visits).values({ patientId, siteId, visitDate: "2026-02-02", examinerId, status, signedAt: status === "signed" ? new Date() : null }).returning({ id: s.visits.id });
  const [t] = await db.insert(s.lesionTracks).values({ patientId, siteId, label: `K${v!.id.slice(0, 4)}` }).returning({ id: s.lesionTracks.id });
  await db.insert(s.lesions).values({ visitId: v!.id, siteId, trackId: t!.id, label: "L1", clockStartH: 1, clockEndH: 3, distanceStartCm: 1, distanceEndCm: 2, zone: "transformation_zone", grade: "lsil" });
  return { visitId: v!.id, trackId: t!.id };
}
const post = (who: Actor, visitId: string, reason: unknown) => discard(req("POST", `/api/visits/${visitId}/discard`, who, { reason }), ctx({ visitId }));
const exists = async (visitId: string) => (await db.select({ id: s.visits.id }).from(s.visits).where(eq(s.visits.id, visitId))).length === 1;

beforeAll(async () => {
  siteId = (await makeSite("Discard")).id;
  [examiner, colleague, admin] = await Promise.all([actor("clinician", [siteId]), actor("clinician", [siteId]), actor("admin", [siteId])]);
  patientId = (await makePatient(siteId)).id;
});

describe("discarding a draft visit", () => {
  it("lets the examiner discard a draft with a reason: gone from the visit list, the timeline and its track, kept in the audit log", async () => {
    const { visitId, trackId } = await draftWithLesion(examiner.userId);
    const reason = "Opened on the wrong patient by mistake";
    expect((await post(examiner, visitId, reason)).status).toBe(200);
    expect(await exists(visitId)).toBe(false);
    expect((await listVisitsForPatient({ userId: examiner.userId, siteIds: [siteId] }, patientId)).map((v) => v.id)).not.toContain(visitId);
    const tl = await (await timeline(req("GET", `/api/patients/${patientId}/timeline`, examiner), ctx({ patientId }))).text();
    expect(tl).not.toContain(visitId);
    expect(await db.select().from(s.lesionTracks).where(eq(s.lesionTracks.id, trackId))).toEqual([]);
    const [row] = await db.select().from(s.auditEvents).where(and(eq(s.auditEvents.entityId, visitId), eq(s.auditEvents.action, "visit.discard")));
    expect(row?.userId).toBe(examiner.userId);
    expect((row?.detail as { reason: string; lesions: unknown[] }).reason).toBe(reason);
    expect((row?.detail as { lesions: unknown[] }).lesions).toHaveLength(1);
  });

  it("lets an administrator discard another's draft, and refuses a clinician who is not its examiner (403)", async () => {
    const a = await draftWithLesion(examiner.userId);
    expect((await post(colleague, a.visitId, "Not mine but looks like a duplicate")).status).toBe(403);
    expect(await exists(a.visitId)).toBe(true);
    expect((await post(admin, a.visitId, "Duplicate draft opened twice at the desk")).status).toBe(200);
    expect(await exists(a.visitId)).toBe(false);
  });

  it("never discards a signed visit (423)", async () => {
    const { visitId } = await draftWithLesion(examiner.userId, "signed");
    expect((await post(admin, visitId, "Trying to remove a signed record")).status).toBe(423);
    expect(await exists(visitId)).toBe(true);
  });

  it.each(["", "..........", "oops", "aaaaaaaaaaaaa"])("refuses the reason %j with 400 on the reason field and discards nothing", async (reason) => {
    const { visitId } = await draftWithLesion(examiner.userId);
    const res = await post(examiner, visitId, reason);
    expect(res.status).toBe(400);
    expect(Object.keys((await res.json()).error.fields)).toEqual(["reason"]);
    expect(await exists(visitId)).toBe(true);
  });
});
