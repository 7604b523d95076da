// Dates of care the record cannot hold are refused at the boundary (400 with the field's message,
// nothing written), and a bad date already stored (written straight into SQL, as an old import or
// a hand fix could) flags its row without taking a list page down.
// Bounds: not before the patient's birth, not more than a day after today (common practice, no
// source: an exam cannot precede birth or lie in the future). 9999-12-31 is the value whose next
// day (10000-01-01) cannot be written as an ISO 8601 calendar date (ISO 8601-1:2019, 4-digit years).
import { beforeAll, describe, expect, it } from "vitest";
import { eq, sql } from "drizzle-orm";
import { db } from "@/db/client";
import * as s from "@/db/schema";
import { POST as createVisit } from "@/app/api/patients/[patientId]/visits/route";
import { PATCH as saveExam } from "@/app/api/visits/[visitId]/route";
import { GET as listPatients } from "@/app/api/patients/route";
import { GET as timeline } from "@/app/api/patients/[patientId]/timeline/route";
import { listWorklist } from "@/lib/server/worklist";
import { readPatientRecord } from "@/lib/server/patient-record";
import { actor, ctx, makePatient, makeSite, req, type Actor } from "../fixtures/factory";

let siteId: string, clinician: Actor, patientId: string;
const day = (offset: number) => new Date(Date.now() + offset * 86_400_000).toISOString().slice(0, 10);
const visitsOf = async (id: string) => db.select({ id: s.visits.id }).from(s.visits).where(eq(s.visits.patientId, id));

beforeAll(async () => {
  siteId = (await makeSite("Dates")).id;
  clinician = await actor("clinician", [siteId]);
  patientId = (await makePatient(siteId, { dateOfBirth: "1980-06-15" })).id;
});

describe("dates of care are bounded at the boundary", () => {
  it.each([
    ["9999-12-31", /after/],
    [day(3), /after/],
    ["1980-06-14", /birth/],
  ])("refuses a new visit dated %s with 400 and writes nothing", async (visitDate, message) => {
    const res = await createVisit(req("POST", `/api/patients/${patientId}/visits`, clinician, { visitDate, patientPosition: "lithotomy" }), ctx({ patientId }));
    expect(res.status).toBe(400);
    expect((await res.json()).error.fields.visitDate[0]).toMatch(message);
    expect(await visitsOf(patientId)).toEqual([]);
  });

  it("refuses moving a draft's date or exam time before the patient's birth", async () => {
    const res = await createVisit(req("POST", `/api/patients/${patientId}/visits`, clinician, { visitDate: day(0), patientPosition: "lithotomy" }), ctx({ patientId }));
    expect(res.status).toBe(201);
    const visitId = (await res.json()).visit.id as string;
    const body = { visitDate: "1970-01-01", patientPosition: "lithotomy", cytology: "not_done", hpvResult: "not_done", examStartedAt: "1970-01-01T09:00:00Z", version: 1 };
    const bad = await saveExam(req("PATCH", `/api/visits/${visitId}`, clinician, body), ctx({ visitId }));
    expect(bad.status).toBe(400);
    expect(Object.keys((await bad.json()).error.fields).sort()).toEqual(["examStartedAt", "visitDate"]);
    const [row] = await db.select({ visitDate: s.visits.visitDate, version: s.visits.version }).from(s.visits).where(eq(s.visits.id, visitId));
    expect(row).toEqual({ visitDate: day(0), version: 1 });
  });
});

describe("a stored date the calendar cannot step past flags its row; the lists are still served", () => {
  let bad: string, good: string;
  beforeAll(async () => {
    bad = (await makePatient(siteId, { familyName: "Farfuture" })).id;
    good = (await makePatient(siteId, { familyName: "Ordinary" })).id;
    await db.execute(sql`INSERT INTO visits (patient_id, site_id, visit_date, examiner_id, patient_position) VALUES
      (${bad}, ${siteId}, '9999-12-31', ${clinician.userId}, 'lithotomy'), (${good}, ${siteId}, ${day(-400)}, ${clinician.userId}, 'lithotomy')`);
  });
  const scope = () => ({ userId: clinician.userId, siteIds: [siteId] });

  it("the worklist lists the bad row flagged beside the good one", async () => {
    const list = await listWorklist(scope(), {}, day(0));
    const byId = new Map(list.rows.map((r) => [r.patientId, r]));
    expect(byId.get(bad)?.dateProblem).toBe(true);
    expect(byId.get(good)?.dateProblem).toBeFalsy();
  });

  it("the patient page reads the patient with the bad visit, its due date flagged", async () => {
    const record = await readPatientRecord(scope(), bad, "127.0.0.1");
    expect(record?.visits.map((v) => v.visitDate)).toContain("9999-12-31");
    expect(record?.due?.dateProblem).toBe(true);
  });

  it("the patients list (sorted by next due too) and the timeline answer 200", async () => {
    for (const sort of ["name", "nextDue"]) {
      const res = await listPatients(req("GET", `/api/patients?sort=${sort}`, clinician), ctx({}));
      expect(res.status).toBe(200);
    }
    const res = await timeline(req("GET", `/api/patients/${bad}/timeline`, clinician), ctx({ patientId: bad }));
    expect(res.status).toBe(200);
  });
});
