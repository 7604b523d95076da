// The timeline reads the patient (with visits and tracks), the lesions and the statuses in three
// statements sent at once, each with its own snapshot. Whatever lands between them, the answer
// must hang together: every lesion and status belongs to a visit and a track the answer lists
// (a grid cell with no column would be drawn nowhere or break the screen: common practice, no
// source). Here a status row whose visit is not this patient's stands in for one made in between.
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { lesions, lesionTracks, trackStatuses, visits } from "@/db/schema";
import { GET as timeline } from "@/app/api/patients/[patientId]/timeline/route";
import { decodeTimeline } from "@/lib/timeline/wire";
import { actor, ctx, makePatient, makeSite, req, type Actor } from "../fixtures/factory";

let who: Actor, patientId: string, visitId: string, strayVisitId: string, trackId: string;

beforeAll(async () => {
  const siteId = (await makeSite("Rows")).id;
  who = await actor("clinician", [siteId]);
  patientId = (await makePatient(siteId)).id;
  const otherPatient = (await makePatient(siteId)).id;
  const [v] = await db.insert(visits).values({ patientId, siteId, visitDate: "2025-02-01", examinerId: who.userId, status: "signed", signedAt: new Date() }).returning();
  const [stray] = await db.insert(visits).values({ patientId: otherPatient, siteId, visitDate: "2025-03-01", examinerId: who.userId, status: "signed", signedAt: new Date() }).returning();
  visitId = v!.id;
  strayVisitId = stray!.id;
  const [t] = await db.insert(lesionTracks).values({ patientId, siteId, label: "#1" }).returning();
  trackId = t!.id;
  await db.insert(lesions).values({ visitId, siteId, trackId, label: "L1", clockStartH: 2, clockEndH: 3, distanceStartCm: 1, distanceEndCm: 2, zone: "transformation_zone", grade: "lsil" });
  await db.insert(trackStatuses).values([
    { trackId, visitId, siteId, status: "new", effectiveGrade: "lsil", reason: "first recorded" },
    { trackId, visitId: strayVisitId, siteId, status: "persistent", effectiveGrade: "lsil", reason: "a row of a visit the answer does not list" },
  ]);
});

describe("timeline rows", () => {
  it("answers only lesions and statuses of the visits and tracks it lists", async () => {
    const res = await timeline(req("GET", `/api/patients/${patientId}/timeline`, who), ctx({ patientId }));
    expect(res.status).toBe(200);
    const t = decodeTimeline<{ visits: { id: string }[]; tracks: { id: string }[]; lesions: { visitId: string }[]; statuses: { visitId: string; trackId: string }[] }>(await res.json());
    expect(t.visits.map((v) => v.id)).toEqual([visitId]);
    expect(t.lesions.map((l) => l.visitId)).toEqual([visitId]);
    expect(t.statuses).toEqual([expect.objectContaining({ visitId, trackId })]);
  });
});
