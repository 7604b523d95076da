// A visit's specimens and its earlier tracks are identified data: reading them leaves an audit row
// (HIPAA Security Rule, 45 CFR 164.312(b), audit controls). A visit asked for under another
// patient's address is not found, and no read of it is recorded.
import { beforeAll, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { db } from "@/db/client";
import * as s from "@/db/schema";
import { listLesionsForVisit } from "@/db/queries/lesions";
import { GET as getBiopsies } from "@/app/api/visits/[visitId]/biopsies/route";
import { GET as getTracks } from "@/app/api/visits/[visitId]/tracks/route";
import { GET as getVisit } from "@/app/api/visits/[visitId]/route";
import { actor, ctx, makePatient, makeSite, req, type Actor } from "../fixtures/factory";

let clinician: Actor, siteId: string, patientA: string, patientB: string, visitOfA: string;
const rows = (action: string, entityId: string) =>
  db.select().from(s.auditEvents).where(and(eq(s.auditEvents.userId, clinician.userId), eq(s.auditEvents.action, action), eq(s.auditEvents.entityId, entityId)));

beforeAll(async () => {
  siteId = (await makeSite("VisitReads")).id;
  clinician = await actor("clinician", [siteId]);
  patientA = (await makePatient(siteId)).id;
  patientB = (await makePatient(siteId)).id;
  const [v] = await db.insert(s.visits).values({ patientId: patientA, siteId, visitDate: "2026-02-02", examinerId: clinician.userId }).returning({ id: s.visits.id });
  visitOfA = v!.id;
});

describe("reads of a visit's parts are audited", () => {
  it("records a read of the visit's biopsies, with its patient and site", async () => {
    const res = await getBiopsies(req("GET", `/api/visits/${visitOfA}/biopsies`, clinician), ctx({ visitId: visitOfA }));
    expect(res.status).toBe(200);
    const [row] = await rows("visit.biopsies.read", visitOfA);
    expect(row).toMatchObject({ patientId: patientA, siteId, entityType: "visit" });
  });

  it("records a read of the visit's earlier tracks", async () => {
    const res = await getTracks(req("GET", `/api/visits/${visitOfA}/tracks`, clinician), ctx({ visitId: visitOfA }));
    expect(res.status).toBe(200);
    expect(await rows("visit.tracks.read", visitOfA)).toHaveLength(1);
  });
});

describe("the visit page's read, narrowed to the patient in the address", () => {
  const audit = () => ({ userId: clinician.userId, action: "visit.read.page-check", entityType: "visit" });
  const scope = () => ({ userId: clinician.userId, siteIds: [siteId] });

  it("answers not found for a visit of another patient and records no read", async () => {
    await expect(listLesionsForVisit(scope(), visitOfA, audit(), patientB)).rejects.toMatchObject({ code: "not_found" });
    expect(await rows("visit.read.page-check", visitOfA)).toHaveLength(0);
  });

  it("reads and records the visit under its own patient", async () => {
    const map = await listLesionsForVisit(scope(), visitOfA, audit(), patientA);
    expect(map.visit.id).toBe(visitOfA);
    expect(await rows("visit.read.page-check", visitOfA)).toHaveLength(1);
  });
});

describe("refused attempts on patient data are recorded", () => {
  const refusals = (userId: string) => db.select().from(s.auditEvents).where(and(eq(s.auditEvents.userId, userId), eq(s.auditEvents.action, "access.refused")));

  it("records another site's clinician asking for this visit's biopsies (404), with the path", async () => {
    const outsider = await actor("clinician", [(await makeSite("Elsewhere")).id]);
    const res = await getBiopsies(req("GET", `/api/visits/${visitOfA}/biopsies`, outsider), ctx({ visitId: visitOfA }));
    expect(res.status).toBe(404);
    const [row] = await refusals(outsider.userId);
    expect(row?.detail).toMatchObject({ method: "GET", path: `/api/visits/${visitOfA}/biopsies`, status: 404 });
  });

  it("records the research nurse refused an identified visit (403)", async () => {
    const nurse = await actor("research_nurse", [siteId]);
    const res = await getVisit(req("GET", `/api/visits/${visitOfA}`, nurse), ctx({ visitId: visitOfA }));
    expect(res.status).toBe(403);
    expect(await refusals(nurse.userId)).toHaveLength(1);
  });
});
