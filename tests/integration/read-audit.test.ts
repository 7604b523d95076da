// Reads of a patient record that write their audit row in the reading statement. Audit of every
// read of a patient record: HIPAA Security Rule, 45 CFR 164.312(b) (audit controls); the rest is
// this project's own contract (DEVELOPERS.md, "Layering"), checked against the real database.
import { beforeAll, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { auditEvents, visits } from "@/db/schema";
import { GET as mapOf } from "@/app/api/visits/[visitId]/lesions/route";
import { GET as timeline } from "@/app/api/patients/[patientId]/timeline/route";
import { actor, ctx, makePatient, makeSite, req, type Actor } from "../fixtures/factory";

let siteA: string, patientId: string, visitId: string;
let clinician: Actor, elsewhere: Actor;

async function audits(action: string, where: { patientId?: string; entityId?: string; userId?: string }) {
  const conds = [eq(auditEvents.action, action)];
  if (where.patientId) conds.push(eq(auditEvents.patientId, where.patientId));
  if (where.entityId) conds.push(eq(auditEvents.entityId, where.entityId));
  if (where.userId) conds.push(eq(auditEvents.userId, where.userId));
  return db.select().from(auditEvents).where(and(...conds));
}

beforeAll(async () => {
  siteA = (await makeSite()).id;
  const siteB = (await makeSite()).id;
  clinician = await actor("clinician", [siteA]);
  elsewhere = await actor("clinician", [siteB]);
  patientId = (await makePatient(siteA)).id;
  const [v] = await db.insert(visits).values({ patientId, siteId: siteA, visitDate: "2026-03-01", examinerId: clinician.userId }).returning();
  visitId = v!.id;
});

describe("reads audited by the reading statement", () => {
  it("opening the timeline records one audit row with the patient and site", async () => {
    const res = await timeline(req("GET", "/x", clinician), ctx({ patientId }));
    expect(res.status).toBe(200);
    const rows = await audits("patient.timeline.read", { patientId, userId: clinician.userId });
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({ siteId: siteA, patientId });
  });

  it("opening a visit's map records one audit row naming the visit", async () => {
    const res = await mapOf(req("GET", "/x", clinician), ctx({ visitId }));
    expect(res.status).toBe(200);
    const rows = await audits("visit.map.read", { entityId: visitId, userId: clinician.userId });
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({ siteId: siteA, patientId, entityType: "visit" });
  });

  it("a record of another site answers 404 and records no read", async () => {
    expect((await timeline(req("GET", "/x", elsewhere), ctx({ patientId }))).status).toBe(404);
    expect((await mapOf(req("GET", "/x", elsewhere), ctx({ visitId }))).status).toBe(404);
    expect(await audits("patient.timeline.read", { patientId, userId: elsewhere.userId })).toHaveLength(0);
    expect(await audits("visit.map.read", { entityId: visitId, userId: elsewhere.userId })).toHaveLength(0);
  });
});
