import { beforeAll, describe, expect, it } from "vitest";
import { and, count, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { visits } from "@/db/schema";
import { GET as getPatient } from "@/app/api/patients/[patientId]/route";
import { GET as listPatients } from "@/app/api/patients/route";
import { POST as createVisit } from "@/app/api/patients/[patientId]/visits/route";
import { actor, ctx, makePatient, makeSite, req, type Actor } from "../fixtures/factory";

let siteA: string, siteB: string, patientA: string, patientB: string;
let clinician: Actor, nurse: Actor, reviewer: Actor, otherClinician: Actor;

beforeAll(async () => {
  siteA = (await makeSite("A")).id;
  siteB = (await makeSite("B")).id;
  patientA = (await makePatient(siteA)).id;
  patientB = (await makePatient(siteB)).id;
  clinician = await actor("clinician", [siteA]);
  nurse = await actor("research_nurse", [siteA]);
  reviewer = await actor("reviewer", [siteA]);
  otherClinician = await actor("clinician", [siteB]);
});

async function visitCount(patientId: string) {
  const [r] = await db.select({ n: count() }).from(visits).where(and(eq(visits.patientId, patientId)));
  return r!.n;
}

describe("the role-and-site guard on route handlers", () => {
  it("answers 401 JSON without a session", async () => {
    const res = await listPatients(req("GET", "/api/patients", null));
    expect(res.status).toBe(401);
    expect((await res.json()).error.code).toBe("unauthenticated");
  });

  it("answers 401 for a forged session id", async () => {
    const res = await listPatients(req("GET", "/api/patients", { ...clinician, cookie: "dentate_session=not-a-session" }));
    expect(res.status).toBe(401);
  });

  it("answers 403 to a research nurse on a clinician-only mutation and writes nothing", async () => {
    const before = await visitCount(patientA);
    const res = await createVisit(req("POST", `/api/patients/${patientA}/visits`, nurse, { visitDate: "2026-02-03", patientPosition: "lithotomy" }), ctx({ patientId: patientA }));
    expect(res.status).toBe(403);
    expect(await visitCount(patientA)).toBe(before);
  });

  it("answers 403 to a reviewer creating a visit", async () => {
    const res = await createVisit(req("POST", `/api/patients/${patientA}/visits`, reviewer, { visitDate: "2026-02-03", patientPosition: "lithotomy" }), ctx({ patientId: patientA }));
    expect(res.status).toBe(403);
  });

  it("answers 404 for another site's patient, on reads and on writes", async () => {
    const read = await getPatient(req("GET", `/api/patients/${patientA}`, otherClinician), ctx({ patientId: patientA }));
    expect(read.status).toBe(404);
    const before = await visitCount(patientA);
    const write = await createVisit(req("POST", `/api/patients/${patientA}/visits`, otherClinician, { visitDate: "2026-02-03", patientPosition: "lithotomy" }), ctx({ patientId: patientA }));
    expect(write.status).toBe(404);
    expect(await visitCount(patientA)).toBe(before);
  });

  it("lists only the caller's site's patients", async () => {
    const res = await listPatients(req("GET", "/api/patients", clinician));
    const body = await res.json();
    const ids = body.rows.map((r: { id: string }) => r.id);
    expect(ids).toContain(patientA);
    expect(ids).not.toContain(patientB);
  });

  it("lets the clinician create a visit (201) that is stored with them as examiner", async () => {
    const res = await createVisit(req("POST", `/api/patients/${patientA}/visits`, clinician, { visitDate: "2026-02-03", patientPosition: "prone_jackknife" }), ctx({ patientId: patientA }));
    expect(res.status).toBe(201);
    const { visit } = await res.json();
    const [row] = await db.select().from(visits).where(eq(visits.id, visit.id));
    expect(row!.examinerId).toBe(clinician.userId);
    expect(row!.patientPosition).toBe("prone_jackknife");
    expect(row!.siteId).toBe(siteA);
  });

  it("answers 400 with field messages for bad input and writes nothing", async () => {
    const before = await visitCount(patientA);
    const res = await createVisit(req("POST", `/api/patients/${patientA}/visits`, clinician, { visitDate: "14/03/2026", patientPosition: "upside-down" }), ctx({ patientId: patientA }));
    expect(res.status).toBe(400);
    const body = await res.json();
    expect(Object.keys(body.error.fields)).toEqual(expect.arrayContaining(["visitDate", "patientPosition"]));
    const notJson = await createVisit(req("POST", `/api/patients/${patientA}/visits`, clinician, "{not json"), ctx({ patientId: patientA }));
    expect(notJson.status).toBe(400);
    expect(await visitCount(patientA)).toBe(before);
  });

  it("refuses a mutation from a foreign Origin", async () => {
    const before = await visitCount(patientA);
    const res = await createVisit(req("POST", `/api/patients/${patientA}/visits`, clinician, { visitDate: "2026-02-03", patientPosition: "lithotomy" }, { origin: "https://evil.example" }), ctx({ patientId: patientA }));
    expect(res.status).toBe(403);
    expect(await visitCount(patientA)).toBe(before);
  });

  it("answers 404, not 500, for a malformed id", async () => {
    const res = await getPatient(req("GET", "/api/patients/abc", clinician), ctx({ patientId: "abc" }));
    expect(res.status).toBe(404);
  });
});
