// Track statuses come from signed visits only: an unsigned draft is work in progress, shown on the
// timeline as a draft, and neither clears a track nor sets up a later "recurrent". Worked by hand
// from the status rules (lib/tracking/status.ts): HSIL treated at visit 1; at the next signed look
// HSIL again at the treated site = persistent (Liu Y, Sigel K, Gaisa MM, Papillomavirus Research
// 2018;5:S9). Had the draft's "not found" counted, it would read cleared and then recurrent.
import { beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import { trackStatuses, treatments, visits } from "@/db/schema";
import { POST as createLesion } from "@/app/api/visits/[visitId]/lesions/route";
import { POST as trackAction } from "@/app/api/visits/[visitId]/tracks/route";
import { POST as sign } from "@/app/api/visits/[visitId]/sign/route";
import { GET as timeline } from "@/app/api/patients/[patientId]/timeline/route";
import { decodeTimeline } from "@/lib/timeline/wire";
import type { Timeline } from "@/lib/api/types";
import { actor, ctx, makePatient, makeSite, req, type Actor } from "../fixtures/factory";

let siteId: string, clinician: Actor;
beforeAll(async () => {
  siteId = (await makeSite("Drafts")).id;
  clinician = await actor("clinician", [siteId]);
});

async function draft(patientId: string, visitDate: string) {
  const [v] = await db.insert(visits).values({ patientId, siteId, visitDate, examinerId: clinician.userId }).returning({ id: visits.id });
  return v!.id;
}
const lesionAt = async (visitId: string, grade = "hsil") =>
  (await (await createLesion(req("POST", "/x", clinician, { clockStartH: 2, clockEndH: 3, distanceStartCm: 1, distanceEndCm: 2, grade }), ctx({ visitId }))).json()).lesion as { id: string; trackId: string };
const signReq = (visitId: string) => sign(req("POST", "/x", clinician), ctx({ visitId }));
const statusesOf = async (trackId: string) =>
  (await db.select({ visitId: trackStatuses.visitId, status: trackStatuses.status }).from(trackStatuses).where(eq(trackStatuses.trackId, trackId)));
/** A new patient whose first visit found HSIL, treated it and was signed. */
async function treatedAndSigned() {
  const patientId = (await makePatient(siteId)).id;
  const v1 = await draft(patientId, "2025-01-10");
  const a = await lesionAt(v1);
  await db.insert(treatments).values({ visitId: v1, siteId, lesionId: a.id, modality: "laser", arcs: [{ startH: 2, endH: 3 }], treatedFraction: 1 / 12 });
  expect((await signReq(v1)).status).toBe(200);
  return { patientId, v1, a };
}

describe("a draft visit drives no status", () => {
  it("a draft's 'not found' neither clears the treated track nor makes the next signed finding recurrent", async () => {
    const { patientId, v1, a } = await treatedAndSigned();

    // An unsigned draft between two signed visits, with the track marked not found.
    const v2 = await draft(patientId, "2025-07-10");
    expect((await trackAction(req("POST", "/x", clinician, { action: "check", trackId: a.trackId, outcome: "not_found" }), ctx({ visitId: v2 }))).status).toBe(200);
    expect(await statusesOf(a.trackId)).toEqual([{ visitId: v1, status: "new" }]);

    // The next signed visit finds HSIL again at the treated site.
    const v3 = await draft(patientId, "2026-01-10");
    const again = await lesionAt(v3);
    expect((await trackAction(req("POST", "/x", clinician, { action: "link", lesionId: again.id, trackId: a.trackId }), ctx({ visitId: v3 }))).status).toBe(200);
    expect((await signReq(v3)).status).toBe(200);
    const rows = await statusesOf(a.trackId);
    expect(rows.find((r) => r.visitId === v2)).toBeUndefined();
    expect(rows.find((r) => r.visitId === v3)?.status).toBe("persistent");

    // The timeline shows the draft as a draft, with no status at it.
    const t = decodeTimeline<Timeline>(await (await timeline(req("GET", "/x", clinician), ctx({ patientId }))).json());
    expect(t.visits.map((v) => [v.visitDate, v.status])).toEqual([["2025-01-10", "signed"], ["2025-07-10", "draft"], ["2026-01-10", "signed"]]);
    expect(t.statuses.filter((s) => s.visitId === v2)).toEqual([]);
  });

  it("an empty draft after a treated visit gives no clearance; signing it asks for the decision first", async () => {
    const { patientId, a } = await treatedAndSigned();
    const v2 = await draft(patientId, "2025-07-10");
    await lesionAt(v2, "lsil"); // a lesion elsewhere on its own track, written on the draft
    expect((await statusesOf(a.trackId)).map((r) => r.status)).toEqual(["new"]);
    expect((await signReq(v2)).status).toBe(409);
  });
});
