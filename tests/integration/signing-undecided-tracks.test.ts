// Signing a follow-up visit reads every earlier track without a lesion there as looked for and not
// found, which after treatment counts as cleared. So signing is refused while an earlier track has
// no decision at the visit (found, not found, treated, not examined), naming the tracks; and "not
// examined" gives no status at all: never cleared, nor a clearance in the study figures (rule:
// common practice, no source; treated then not found = cleared: Richel O et al., Lancet Oncol
// 2013;14:346-53, as in lib/tracking/status.ts).
import { beforeAll, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { lesions, lesionTracks, trackStatuses, treatments, visits } from "@/db/schema";
import { POST as createLesion } from "@/app/api/visits/[visitId]/lesions/route";
import { GET as followUp, POST as trackAction } from "@/app/api/visits/[visitId]/tracks/route";
import { POST as sign } from "@/app/api/visits/[visitId]/sign/route";
import { actor, ctx, makePatient, makeSite, req, type Actor } from "../fixtures/factory";

let siteId: string, clinician: Actor;
beforeAll(async () => {
  siteId = (await makeSite("Signing tracks")).id;
  clinician = await actor("clinician", [siteId]);
});

async function draft(patientId: string, visitDate: string) {
  const [v] = await db.insert(visits).values({ patientId, siteId, visitDate, examinerId: clinician.userId }).returning({ id: visits.id });
  return v!.id;
}
const signReq = (visitId: string) => sign(req("POST", `/api/visits/${visitId}/sign`, clinician), ctx({ visitId }));
const act = (visitId: string, body: unknown) => trackAction(req("POST", "/x", clinician, body), ctx({ visitId }));
const lesionAt = async (visitId: string, startH: number, grade = "hsil") =>
  (await (await createLesion(req("POST", "/x", clinician, { clockStartH: startH, clockEndH: startH + 1, distanceStartCm: 1, distanceEndCm: 2, grade }), ctx({ visitId }))).json()).lesion as { id: string; trackId: string };
const statusAt = async (trackId: string, visitId: string) =>
  (await db.select({ status: trackStatuses.status }).from(trackStatuses).where(and(eq(trackStatuses.trackId, trackId), eq(trackStatuses.visitId, visitId))))[0]?.status ?? null;
const labelOf = async (trackId: string) => (await db.select({ label: lesionTracks.label }).from(lesionTracks).where(eq(lesionTracks.id, trackId)))[0]!.label;

describe("signing a follow-up visit with earlier tracks", () => {
  it("refuses (409) while an earlier track is undecided, naming each by its label, and signs nothing", async () => {
    const patientId = (await makePatient(siteId)).id;
    const v1 = await draft(patientId, "2025-01-10");
    const treatedOne = await lesionAt(v1, 1);
    const other = await lesionAt(v1, 7, "lsil");
    await db.insert(treatments).values({ visitId: v1, siteId, lesionId: treatedOne.id, modality: "electrocautery", arcs: [{ startH: 1, endH: 2 }], treatedFraction: 1 / 12 });
    expect((await signReq(v1)).status).toBe(200); // a first visit has no earlier track to decide on

    const v2 = await draft(patientId, "2025-07-10");
    const res = await signReq(v2);
    expect(res.status).toBe(409);
    const body = await res.json();
    const [l1, l2] = [await labelOf(treatedOne.trackId), await labelOf(other.trackId)];
    expect(body.error.message).toContain(`(${[l1, l2].join(", ")})`);
    expect(body.error.message).toMatch(/found, not found or not examined/);
    expect(Object.keys(body.error.fields).sort()).toEqual([`track.${treatedOne.trackId}`, `track.${other.trackId}`].sort());
    expect(body.error.fields[`track.${treatedOne.trackId}`][0]).toContain(l1);
    const [v] = await db.select({ status: visits.status }).from(visits).where(eq(visits.id, v2));
    expect(v!.status).toBe("draft");
    // The treated track was not read as cleared.
    expect(await statusAt(treatedOne.trackId, v2)).toBeNull();

    // One decided, one still open: still refused, naming only the open one.
    expect((await act(v2, { action: "check", trackId: other.trackId, outcome: "not_found" })).status).toBe(200);
    const again = await (await signReq(v2)).json();
    expect(Object.keys(again.error.fields)).toEqual([`track.${treatedOne.trackId}`]);
  });

  it("accepts 'not examined' as a decision, which gives the track no status (not cleared)", async () => {
    const patientId = (await makePatient(siteId)).id;
    const v1 = await draft(patientId, "2025-01-10");
    const a = await lesionAt(v1, 1);
    await db.insert(treatments).values({ visitId: v1, siteId, lesionId: a.id, modality: "laser", arcs: [{ startH: 1, endH: 2 }], treatedFraction: 1 / 12 });
    expect((await signReq(v1)).status).toBe(200);

    const v2 = await draft(patientId, "2025-07-10");
    expect((await act(v2, { action: "check", trackId: a.trackId, outcome: "not_examined" })).status).toBe(200);
    const ctxRes = await (await followUp(req("GET", "/x", clinician), ctx({ visitId: v2 }))).json();
    expect(ctxRes.ghosts.find((g: { trackId: string }) => g.trackId === a.trackId).checkHere).toBe("not_examined");
    expect((await signReq(v2)).status).toBe(200);
    expect(await statusAt(a.trackId, v2)).toBeNull();

    // Looked for and not found at the next visit: that one is the clearance.
    const v3 = await draft(patientId, "2026-01-10");
    expect((await act(v3, { action: "check", trackId: a.trackId, outcome: "not_found" })).status).toBe(200);
    expect((await signReq(v3)).status).toBe(200);
    expect(await statusAt(a.trackId, v3)).toBe("cleared");
  });

  it("counts a lesion linked to the track at this visit as its decision", async () => {
    const patientId = (await makePatient(siteId)).id;
    const v1 = await draft(patientId, "2025-01-10");
    const a = await lesionAt(v1, 3);
    expect((await signReq(v1)).status).toBe(200);
    const v2 = await draft(patientId, "2025-07-10");
    const here = await lesionAt(v2, 3);
    expect((await signReq(v2)).status).toBe(409);
    expect((await act(v2, { action: "link", lesionId: here.id, trackId: a.trackId })).status).toBe(200);
    expect((await signReq(v2)).status).toBe(200);
    expect(await statusAt(a.trackId, v2)).toBe("persistent");
    expect(await db.select().from(lesions).where(eq(lesions.trackId, a.trackId))).toHaveLength(2);
  });
});
