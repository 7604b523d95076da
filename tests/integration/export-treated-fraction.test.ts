// The counts export's treated_fraction is the share of the circumference treated at the visit:
// the union of the visit's treated arcs, which every treatment row of the visit carries
// (stampVisitTreatedFraction). Two treatments of 2 hours each on opposite sides treat 4 of 12
// hours = 1/3 (30° per clock hour, geometry), not 1/3 + 1/3 summed row by row.
import { beforeAll, describe, expect, it } from "vitest";
import { parse } from "csv-parse/sync";
import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import * as s from "@/db/schema";
import { POST as addTreatment } from "@/app/api/visits/[visitId]/treatments/route";
import { GET as getCsv } from "@/app/api/exports/[dataset]/route";
import { actor, ctx, makePatient, makeSite, req, type Actor } from "../fixtures/factory";

let siteId: string, studyId: string, visitId: string;
let clinician: Actor, nurse: Actor;

beforeAll(async () => {
  siteId = (await makeSite("Fraction")).id;
  clinician = await actor("clinician", [siteId]);
  nurse = await actor("research_nurse", [siteId]);
  const p = await makePatient(siteId, { consentResearch: true });
  const [study] = await db.insert(s.studies).values({ code: `TF-${siteId.slice(0, 6)}`, title: "Invented fraction study", startDate: "2025-01-01" }).returning();
  studyId = study!.id;
  await db.insert(s.studySites).values({ studyId, siteId });
  await db.insert(s.enrolments).values({ studyId, patientId: p.id, siteId, studySubjectId: "TF-1", consentDate: "2025-01-01" });
  const [v] = await db.insert(s.visits).values({ patientId: p.id, siteId, visitDate: "2025-02-03", examinerId: clinician.userId }).returning({ id: s.visits.id });
  visitId = v!.id;
  for (const arc of [{ startH: 1, endH: 3 }, { startH: 7, endH: 9 }]) {
    const res = await addTreatment(req("POST", `/api/visits/${visitId}/treatments`, clinician, { modality: "electrocautery", arcs: [arc] }), ctx({ visitId }));
    expect(res.status, await res.clone().text()).toBe(201);
  }
  await db.update(s.visits).set({ status: "signed", signedAt: new Date() }).where(eq(s.visits.id, visitId));
});

describe("counts export, share of the circumference treated", () => {
  it("is the union of the visit's treated arcs, a third, not the rows summed", async () => {
    const res = await getCsv(req("GET", `/api/exports/counts?studyId=${studyId}`, nurse), ctx({ dataset: "counts" }));
    expect(res.status).toBe(200);
    const rows = parse(await res.text(), { columns: true }) as Record<string, string>[];
    expect(rows).toHaveLength(1);
    expect(Number(rows[0]!.treated_fraction)).toBeCloseTo(1 / 3, 3);
  });
});
