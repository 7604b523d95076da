// A lesion update whose values equal the stored ones changes nothing: no new version and no audit
// row (an audit trail records changes; a save that changes nothing is not one: common practice, no
// source). An update that does change a value still writes both. Neither sends a track-status
// statement: lesions are written on drafts, and statuses come from signed visits only.
import { beforeAll, describe, expect, it } from "vitest";
import { and, count, eq } from "drizzle-orm";
import { db, onQuery } from "@/db/client";
import { auditEvents, lesions, visits } from "@/db/schema";
import { POST } from "@/app/api/visits/[visitId]/lesions/route";
import { PATCH } from "@/app/api/visits/[visitId]/lesions/[lesionId]/route";
import { actor, ctx, makePatient, makeSite, req, type Actor } from "../fixtures/factory";

let visitId: string, clinician: Actor;
const fields = { clockStartH: 10.7, clockEndH: 1.3, distanceStartCm: -1.5, distanceEndCm: 2.25, grade: "lsil", morphology: "flat", vessels: ["punctation"], sizeMm: 4.5, note: "edge at 11" };

beforeAll(async () => {
  const siteId = (await makeSite()).id;
  clinician = await actor("clinician", [siteId]);
  const patientId = (await makePatient(siteId)).id;
  const [v] = await db.insert(visits).values({ patientId, siteId, visitDate: "2026-04-01", examinerId: clinician.userId }).returning();
  visitId = v!.id;
});

async function auditRows(lesionId: string) {
  const [r] = await db.select({ n: count() }).from(auditEvents).where(and(eq(auditEvents.entityId, lesionId), eq(auditEvents.action, "lesion.update")));
  return r!.n;
}

async function patch(lesionId: string, body: object) {
  const statements: string[] = [];
  const stop = onQuery((q) => statements.push(q));
  try {
    const res = await PATCH(req("PATCH", `/api/visits/${visitId}/lesions/${lesionId}`, clinician, body), ctx({ visitId, lesionId }));
    return { res, statusStatements: statements.filter((q) => /track_statuses/.test(q)).length };
  } finally {
    stop();
  }
}

describe("a lesion update that changes nothing", () => {
  it("answers the stored lesion and writes no version and no audit row", async () => {
    const made = await POST(req("POST", `/api/visits/${visitId}/lesions`, clinician, fields), ctx({ visitId }));
    expect(made.status).toBe(201);
    const { lesion } = await made.json();
    const [before] = await db.select().from(lesions).where(eq(lesions.id, lesion.id));

    // All fields again, then a few of them: both equal what is stored.
    for (const body of [{ version: 1, ...fields, trackId: lesion.trackId }, { version: 1, grade: "lsil", note: "edge at 11" }]) {
      const { res, statusStatements } = await patch(lesion.id, body);
      expect(res.status).toBe(200);
      expect((await res.json()).lesion).toMatchObject({ id: lesion.id, version: 1, grade: "lsil" });
      expect(statusStatements).toBe(0);
    }
    const [after] = await db.select().from(lesions).where(eq(lesions.id, lesion.id));
    expect(after).toEqual(before);
    expect(await auditRows(lesion.id)).toBe(0);

    // One value different: a new version and one audit row (still no status work: a draft).
    const { res, statusStatements } = await patch(lesion.id, { version: 1, ...fields, grade: "hsil" });
    expect(res.status).toBe(200);
    expect((await res.json()).lesion).toMatchObject({ version: 2, grade: "hsil" });
    expect(statusStatements).toBe(0);
    expect(await auditRows(lesion.id)).toBe(1);
  });

  it("still refuses a stale version, even with the stored values", async () => {
    const made = await (await POST(req("POST", `/api/visits/${visitId}/lesions`, clinician, fields), ctx({ visitId }))).json();
    expect((await patch(made.lesion.id, { version: 1, grade: "hsil" })).res.status).toBe(200);
    expect((await patch(made.lesion.id, { version: 1, grade: "hsil" })).res.status).toBe(409);
  });
});
