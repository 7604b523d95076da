import { describe, expect, it } from "vitest";
import { listAuditEvents } from "@/db/queries/audit-trail";
import { recordAudit } from "@/db/queries/audit-write";
import { makePatient, makeSite, makeUser } from "../fixtures/factory";

// Staff know a patient by MRN; the audit filter takes the MRN (any case), not the internal id.
describe("audit trail filtered by MRN", () => {
  it("lists the events of the patient with that MRN only", async () => {
    const site = await makeSite();
    const clin = await makeUser("clinician", [site.id]);
    const a = await makePatient(site.id);
    const b = await makePatient(site.id);
    await recordAudit({ userId: clin, siteId: site.id, patientId: a.id, action: "patient.read" });
    await recordAudit({ userId: clin, siteId: site.id, patientId: a.id, action: "visit.read" });
    await recordAudit({ userId: clin, siteId: site.id, patientId: b.id, action: "patient.read" });
    const r = await listAuditEvents([site.id], { patientMrn: a.mrn.toLowerCase() });
    expect(r.rows.map((e) => e.patientId)).toEqual([a.id, a.id]);
    expect(r.rows.map((e) => e.patientMrn)).toEqual([a.mrn, a.mrn]);
    expect((await listAuditEvents([site.id], { patientMrn: "NO-SUCH-MRN" })).total).toBe(0);
  });
});
