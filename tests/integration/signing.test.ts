import { beforeAll, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { auditEvents, lesions, treatments, visits } from "@/db/schema";
import { GET as getVisit, PATCH as patchVisit } from "@/app/api/visits/[visitId]/route";
import { POST as addTreatment } from "@/app/api/visits/[visitId]/treatments/route";
import { POST as addDose } from "@/app/api/visits/[visitId]/anaesthetic/route";
import { POST as addComplication } from "@/app/api/visits/[visitId]/complications/route";
import { POST as confirm } from "@/app/api/visits/[visitId]/diagnoses/route";
import { POST as sign } from "@/app/api/visits/[visitId]/sign/route";
import { GET as listAddenda, POST as addAddendum } from "@/app/api/visits/[visitId]/addenda/route";
import { actor, ctx, makePatient, makeSite, req, type Actor } from "../fixtures/factory";

let siteA: string, patientA: string;
let examiner: Actor, colleague: Actor, admin: Actor, reviewer: Actor, otherSiteAdmin: Actor;

beforeAll(async () => {
  siteA = (await makeSite("A")).id;
  const siteB = (await makeSite("B")).id;
  patientA = (await makePatient(siteA)).id;
  examiner = await actor("clinician", [siteA]);
  colleague = await actor("clinician", [siteA]);
  admin = await actor("admin", [siteA]);
  reviewer = await actor("reviewer", [siteA]);
  otherSiteAdmin = await actor("admin", [siteB]);
});

async function makeVisit() {
  const [v] = await db.insert(visits).values({ patientId: patientA, siteId: siteA, visitDate: "2026-04-01", examinerId: examiner.userId, cytology: "hsil" }).returning({ id: visits.id });
  return v!.id;
}

const signReq = (visitId: string, who: Actor) => sign(req("POST", `/api/visits/${visitId}/sign`, who), ctx({ visitId }));

describe("signing a visit", () => {
  it("refuses a clinician who did not examine (403), a reviewer (403) and another site's admin (404)", async () => {
    const visitId = await makeVisit();
    const res = await signReq(visitId, colleague);
    expect(res.status).toBe(403);
    expect((await res.json()).error.message).toMatch(/examining clinician/);
    expect((await signReq(visitId, reviewer)).status).toBe(403);
    expect((await signReq(visitId, otherSiteAdmin)).status).toBe(404);
    const [v] = await db.select({ status: visits.status }).from(visits).where(eq(visits.id, visitId));
    expect(v!.status).toBe("draft");
  });

  it("lets the examiner sign once (then 409), records who and when, and audits it", async () => {
    const visitId = await makeVisit();
    const res = await signReq(visitId, examiner);
    expect(res.status).toBe(200);
    const [v] = await db.select().from(visits).where(eq(visits.id, visitId));
    expect(v).toMatchObject({ status: "signed", signedBy: examiner.userId });
    expect(v!.signedAt).toBeInstanceOf(Date);
    expect(await db.select().from(auditEvents).where(and(eq(auditEvents.entityId, visitId), eq(auditEvents.action, "visit.sign")))).toHaveLength(1);
    expect((await signReq(visitId, examiner)).status).toBe(409);
  });

  it("lets an admin of the site sign a visit someone else examined", async () => {
    const visitId = await makeVisit();
    expect((await signReq(visitId, admin)).status).toBe(200);
    const body = await (await getVisit(req("GET", `/api/visits/${visitId}`, examiner), ctx({ visitId }))).json();
    expect(body.visit.signedByName).toBe("Test admin");
    expect(body.permissions).toEqual({ canEdit: false, canSign: false, canAddAddendum: true });
  });
});

describe("a signed visit is immutable; addenda carry later words", () => {
  it("refuses every kind of edit with 423 and the message, and writes nothing", async () => {
    const visitId = await makeVisit();
    const [l] = await db.insert(lesions).values({ visitId, siteId: siteA, label: "L1", clockStartH: 1, clockEndH: 2, distanceStartCm: 1, distanceEndCm: 2, zone: "distal_canal", grade: "hsil" }).returning({ id: lesions.id });
    await signReq(visitId, examiner);
    const base = `/api/visits/${visitId}`;
    const attempts = [
      patchVisit(req("PATCH", base, examiner, { visitDate: "2026-04-01", patientPosition: "lithotomy", cytology: "nilm", hpvResult: "not_done", version: 2 }), ctx({ visitId })),
      addTreatment(req("POST", `${base}/treatments`, examiner, { modality: "laser", lesionId: l!.id, arcs: [] }), ctx({ visitId })),
      addDose(req("POST", `${base}/anaesthetic`, examiner, { agent: "lidocaine", concentrationPct: 1, volumeMl: 2, withEpinephrine: false }), ctx({ visitId })),
      addComplication(req("POST", `${base}/complications`, examiner, { kind: "pain", severity: "mild", timing: "after" }), ctx({ visitId })),
      confirm(req("POST", `${base}/diagnoses`, examiner, { code: "R85.613" }), ctx({ visitId })),
    ];
    for (const res of await Promise.all(attempts)) {
      expect(res.status).toBe(423);
      expect((await res.json()).error.message).toMatch(/signed.*addendum/i);
    }
    expect(await db.select().from(treatments).where(eq(treatments.visitId, visitId))).toHaveLength(0);
  });

  it("accepts addenda in order with author and time, from a clinician or an admin but not a reviewer", async () => {
    const visitId = await makeVisit();
    const path = `/api/visits/${visitId}/addenda`;
    // On a draft an addendum makes no sense: the draft is edited in place.
    expect((await addAddendum(req("POST", path, examiner, { body: "Too early" }), ctx({ visitId }))).status).toBe(409);
    await signReq(visitId, examiner);
    expect((await addAddendum(req("POST", path, colleague, { body: "Histology phoned through: HSIL at L1." }), ctx({ visitId }))).status).toBe(201);
    expect((await addAddendum(req("POST", path, admin, { body: "Copy sent to the referring clinic." }), ctx({ visitId }))).status).toBe(201);
    expect((await addAddendum(req("POST", path, reviewer, { body: "Not allowed" }), ctx({ visitId }))).status).toBe(403);
    expect((await addAddendum(req("POST", path, examiner, { body: "   " }), ctx({ visitId }))).status).toBe(400);
    const { addenda } = await (await listAddenda(req("GET", path, reviewer), ctx({ visitId }))).json();
    expect(addenda.map((a: { body: string }) => a.body)).toEqual(["Histology phoned through: HSIL at L1.", "Copy sent to the referring clinic."]);
    expect(addenda.map((a: { authorName: string }) => a.authorName)).toEqual(["Test clinician", "Test admin"]);
    expect(Date.parse(addenda[1].createdAt)).toBeGreaterThanOrEqual(Date.parse(addenda[0].createdAt));
  });
});
