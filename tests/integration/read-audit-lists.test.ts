// Reads of identified data leave an audit row: the patient list and name/MRN search (one row per
// request, with the query), the biopsy worklist, a review and a patient's open disagreements.
// HIPAA Security Rule, 45 CFR 164.312(b) (audit controls: record activity in systems holding ePHI).
import { beforeAll, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { db } from "@/db/client";
import * as s from "@/db/schema";
import { GET as listPatients } from "@/app/api/patients/route";
import { GET as awaiting } from "@/app/api/biopsies/awaiting/route";
import { GET as patientReviews } from "@/app/api/patients/[patientId]/reviews/route";
import { actor, ctx, makePatient, makeSite, req, type Actor } from "../fixtures/factory";

let clinician: Actor, patientId: string;
const rowsOf = (action: string) => db.select().from(s.auditEvents).where(and(eq(s.auditEvents.userId, clinician.userId), eq(s.auditEvents.action, action)));

beforeAll(async () => {
  const siteId = (await makeSite("Reads")).id;
  clinician = await actor("clinician", [siteId]);
  for (let i = 0; i < 3; i++) patientId = (await makePatient(siteId, { familyName: `Quillfeather${i}` })).id;
});

describe("audited list and search reads", () => {
  it("records one row per patient search with the query typed, not one per patient", async () => {
    const res = await listPatients(req("GET", "/api/patients?q=Quillfeather", clinician), ctx({}));
    expect(res.status).toBe(200);
    const rows = await rowsOf("patient.search");
    expect(rows).toHaveLength(1);
    expect(rows[0]!.detail).toMatchObject({ q: "Quillfeather" });
  });

  it("records the biopsy worklist and a patient's review list", async () => {
    expect((await awaiting(req("GET", "/api/biopsies/awaiting", clinician), ctx({}))).status).toBe(200);
    expect(await rowsOf("biopsy.worklist.read")).toHaveLength(1);
    expect((await patientReviews(req("GET", `/api/patients/${patientId}/reviews`, clinician), ctx({ patientId }))).status).toBe(200);
    const [row] = await rowsOf("review.list");
    expect(row?.patientId).toBe(patientId);
  });
});
