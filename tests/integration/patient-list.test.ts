// The patient list: latest visit, next due date, worst current grade and open disagreements per
// patient, sortable by each, within the caller's sites.
import { describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { adjudications, lesions, lesionTracks, reviews, visits } from "@/db/schema";
import { listPatientOverview } from "@/lib/server/patient-list";
import { refreshTrackStatuses } from "@/lib/server/track-statuses";
import type { Grade } from "@/lib/domain/vocab";
import { makePatient, makeSite, makeUser } from "../fixtures/factory";

async function visit(patientId: string, siteId: string, examinerId: string, visitDate: string, grades: Grade[]) {
  const [v] = await db.insert(visits).values({ patientId, siteId, visitDate, examinerId, status: "signed" }).returning();
  for (const [i, grade] of grades.entries()) {
    const [t] = await db.insert(lesionTracks).values({ patientId, siteId, label: `T${visitDate}${i}` }).returning();
    await db.insert(lesions).values({ visitId: v!.id, siteId, trackId: t!.id, label: `L${i + 1}`, clockStartH: i, clockEndH: i + 1, distanceStartCm: 1, distanceEndCm: 2, zone: "distal_canal", grade });
  }
  await refreshTrackStatuses(db, patientId, siteId);
  return v!;
}

describe("patient list", () => {
  it("shows each patient's latest visit, due date, worst current grade and open disagreements, and sorts by each", async () => {
    const site = await makeSite();
    const clin = await makeUser("clinician", [site.id]);
    const rev = await makeUser("reviewer", [site.id]);
    const a = await makePatient(site.id, { familyName: "Adeyemi" });
    const b = await makePatient(site.id, { familyName: "Brook" });
    await makePatient(site.id, { familyName: "Castellanos" });
    // A: HSIL seen in 2023, then only LSIL at the latest visit: the current grade is the latest visit's.
    await visit(a.id, site.id, clin, "2023-02-01", ["hsil"]);
    await visit(a.id, site.id, clin, "2024-05-02", ["lsil", "benign"]);
    // B: HSIL and condyloma at one visit: the worst is HSIL (LAST tiers; GRADE_RANK, common practice).
    const vb = await visit(b.id, site.id, clin, "2024-01-15", ["condyloma", "hsil"]);
    // C: no visit yet.
    const [t] = await db.insert(lesionTracks).values({ patientId: b.id, siteId: site.id, label: "TX" }).returning();
    const [r] = await db.insert(reviews).values({ patientId: b.id, siteId: site.id, visitId: vb.id, reviewerId: rev, status: "signed_off" }).returning();
    await db.insert(adjudications).values([
      { reviewId: r!.id, siteId: site.id, trackId: t!.id, verdict: "disagree" },
    ]);
    const scope = { userId: clin, siteIds: [site.id] };
    const today = "2025-03-01";
    const list = await listPatientOverview(scope, { page: 1, sort: "name", dir: "asc" }, today);
    const byName = Object.fromEntries(list.rows.map((row) => [row.familyName, row]));
    expect(list.rows.map((row) => row.familyName)).toEqual(["Adeyemi", "Brook", "Castellanos"]);
    expect(byName.Adeyemi).toMatchObject({ lastVisit: "2024-05-02", grade: "lsil", disagreements: 0 });
    expect(byName.Brook).toMatchObject({ lastVisit: "2024-01-15", grade: "hsil", disagreements: 1 });
    expect(byName.Castellanos).toMatchObject({ lastVisit: null, grade: null, nextDue: null, disagreements: 0 });
    expect(byName.Adeyemi!.nextDue).not.toBeNull();
    expect(byName.Brook!.nextDue).not.toBeNull();
    const order = async (sort: "name" | "lastVisit" | "nextDue" | "grade" | "disagreements", dir: "asc" | "desc") =>
      (await listPatientOverview(scope, { page: 1, sort, dir }, today)).rows.map((row) => row.familyName);
    expect(await order("name", "desc")).toEqual(["Castellanos", "Brook", "Adeyemi"]);
    expect(await order("lastVisit", "desc")).toEqual(["Adeyemi", "Brook", "Castellanos"]);
    expect(await order("grade", "desc")).toEqual(["Brook", "Adeyemi", "Castellanos"]);
    expect(await order("disagreements", "desc")).toEqual(["Brook", "Adeyemi", "Castellanos"]);
    // Untreated HSIL comes due sooner than LSIL; a patient without a visit has no due date and goes last.
    const dueOrder = await order("nextDue", "asc");
    expect(dueOrder[2]).toBe("Castellanos");
    expect(byName[dueOrder[0]!]!.nextDue! <= byName[dueOrder[1]!]!.nextDue!).toBe(true);
    expect((await listPatientOverview({ userId: clin, siteIds: [(await makeSite()).id] }, { page: 1, sort: "name", dir: "asc" }, today)).total).toBe(0);
  });
});

describe("patient list and an unsigned draft", () => {
  it("takes the current grade from the latest signed visit while the latest visit is a draft", async () => {
    const site = await makeSite();
    const clin = await makeUser("clinician", [site.id]);
    const p = await makePatient(site.id, { familyName: "Duarte" });
    // HSIL at the signed visit; a later draft, still being examined, with benign findings so far.
    await visit(p.id, site.id, clin, "2024-02-01", ["hsil"]);
    const [d] = await db.insert(visits).values({ patientId: p.id, siteId: site.id, visitDate: "2024-08-01", examinerId: clin }).returning();
    await db.insert(lesions).values({ visitId: d!.id, siteId: site.id, label: "L1", clockStartH: 3, clockEndH: 4, distanceStartCm: 1, distanceEndCm: 2, zone: "distal_canal", grade: "benign" });
    await refreshTrackStatuses(db, p.id, site.id);
    const list = await listPatientOverview({ userId: clin, siteIds: [site.id] }, { page: 1, sort: "name", dir: "asc" }, "2025-03-01");
    expect(list.rows[0]).toMatchObject({ familyName: "Duarte", lastVisit: "2024-08-01", grade: "hsil" });
  });
});
