// Saving the exam details with the values already stored changes nothing: no new version, no audit
// row, no track-status statement (an audit trail records changes; a save that changes nothing is
// not one: common practice, no source). A save that changes one value still writes all of them.
import { beforeAll, describe, expect, it } from "vitest";
import { and, count, eq } from "drizzle-orm";
import { db, onQuery } from "@/db/client";
import { auditEvents, visits } from "@/db/schema";
import { PATCH } from "@/app/api/visits/[visitId]/route";
import { actor, ctx, makePatient, makeSite, req, type Actor } from "../fixtures/factory";

let visitId: string, clinician: Actor;
const exam = {
  visitDate: "2026-05-04", patientPosition: "prone_jackknife", indication: "HSIL on cytology", cytology: "hsil", hpvResult: "hr_positive_16",
  adequacy: "scj_full", examStartedAt: "2026-05-04T09:10:00+02:00", examEndedAt: "2026-05-04T09:40:00+02:00", patientWeightKg: 71.5, plan: "Review in 6 months",
};

beforeAll(async () => {
  const siteId = (await makeSite()).id;
  clinician = await actor("clinician", [siteId]);
  const patientId = (await makePatient(siteId)).id;
  const [v] = await db.insert(visits).values({ patientId, siteId, visitDate: "2026-05-01", examinerId: clinician.userId }).returning();
  visitId = v!.id;
});

async function save(body: object) {
  const statements: string[] = [];
  const stop = onQuery((q) => statements.push(q));
  try {
    const res = await PATCH(req("PATCH", `/api/visits/${visitId}`, clinician, body), ctx({ visitId }));
    return { res, statusStatements: statements.filter((q) => /track_statuses/.test(q)).length };
  } finally {
    stop();
  }
}

async function audits() {
  const [r] = await db.select({ n: count() }).from(auditEvents).where(and(eq(auditEvents.entityId, visitId), eq(auditEvents.action, "visit.exam.update")));
  return r!.n;
}

describe("an exam save that changes nothing", () => {
  it("answers the record as stored and writes no version, no audit row and no status work", async () => {
    const first = await save({ version: 1, ...exam });
    expect(first.res.status).toBe(200);
    expect((await first.res.json()).visit.version).toBe(2);
    expect(await audits()).toBe(1);
    const [before] = await db.select().from(visits).where(eq(visits.id, visitId));

    // The same values again; the start time written with another offset is the same instant.
    for (const body of [{ version: 2, ...exam }, { version: 2, ...exam, examStartedAt: "2026-05-04T07:10:00Z" }]) {
      const again = await save(body);
      expect(again.res.status).toBe(200);
      expect((await again.res.json()).visit).toMatchObject({ version: 2, plan: exam.plan });
      expect(again.statusStatements).toBe(0);
    }
    const [after] = await db.select().from(visits).where(eq(visits.id, visitId));
    expect(after).toEqual(before);
    expect(await audits()).toBe(1);

    // Leaving out a stored optional field empties it: that is a change.
    const cleared = await save({ version: 2, ...exam, plan: undefined });
    expect((await cleared.res.json()).visit).toMatchObject({ version: 3, plan: null });
    expect(await audits()).toBe(2);
  });
});
