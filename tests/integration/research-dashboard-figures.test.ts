// The study dashboard's figures must be the figures a statistician gets from the exports of the
// same study: here every dashboard figure is worked out again from the three CSV exports (counts,
// lesions, outcomes) as a reader of those files would, and compared. The dashboard keeps its figures
// (table study_figures) with their time; a signed visit added afterwards shows once a load finds them
// older than the documented age (lib/server/study-figures.ts) and the refresh it starts has run.
// Both count signed visits only: a draft is never exported and drives no track status; a visit
// where the examiner marked a treated track "not examined" is no clearance.
import { beforeAll, describe, expect, it } from "vitest";
import { parse } from "csv-parse/sync";
import { and, eq } from "drizzle-orm";
import { db } from "@/db/client";
import * as s from "@/db/schema";
import { refreshTrackStatuses } from "@/lib/server/track-statuses";
import { loadRegistryDashboard } from "@/lib/server/research";
import { settleStoredFigures } from "@/lib/server/stored-figures";
import { withdrawPatient } from "@/lib/server/enrolment";
import { GET as getCsv } from "@/app/api/exports/[dataset]/route";
import { GRADES, type Grade, type Histology, type TrackCheckOutcome } from "@/lib/domain/vocab";
import { decideGrade } from "@/lib/tracking/effective-grade";
import { actor, ctx, makePatient, makeSite, req, type Actor } from "../fixtures/factory";

let siteId: string, studyId: string;
let nurse: Actor, clinician: Actor;

type Plan = {
  date: string;
  draft?: boolean;
  lesions: { track: number; grade: Grade; histology?: "lsil" | "hsil"; treat?: boolean }[];
  checks?: { track: number; outcome: TrackCheckOutcome }[];
}[];

async function patientWith(subject: string, plan: Plan, withdrawnOn: string | null = null) {
  const p = await makePatient(siteId, { consentResearch: true });
  const tracks = await db.insert(s.lesionTracks).values([1, 2].map((i) => ({ patientId: p.id, siteId, label: `T${i}` }))).returning({ id: s.lesionTracks.id });
  for (const visit of plan) {
    const status = visit.draft ? "draft" : "signed";
    const [v] = await db.insert(s.visits).values({ patientId: p.id, siteId, visitDate: visit.date, examinerId: clinician.userId, status, signedAt: visit.draft ? null : new Date() }).returning({ id: s.visits.id });
    for (const c of visit.checks ?? []) await db.insert(s.trackChecks).values({ visitId: v!.id, trackId: tracks[c.track]!.id, siteId, outcome: c.outcome });
    let n = 0;
    for (const l of visit.lesions) {
      const [row] = await db.insert(s.lesions).values({ visitId: v!.id, siteId, trackId: tracks[l.track]!.id, label: `L${++n}`, clockStartH: 1 + l.track * 4, clockEndH: 2 + l.track * 4, distanceStartCm: 1, distanceEndCm: 2, zone: "transformation_zone", grade: l.grade }).returning({ id: s.lesions.id });
      if (l.histology) await db.insert(s.biopsies).values({ visitId: v!.id, siteId, lesionId: row!.id, specimenLabel: "A", clockH: 1, distanceCm: 1, histology: l.histology });
      if (l.treat) await db.insert(s.treatments).values({ visitId: v!.id, siteId, lesionId: row!.id, modality: "electrocautery", arcs: [{ startH: 1, endH: 2 }], treatedFraction: 1 / 12 });
    }
  }
  await refreshTrackStatuses(db, p.id, siteId);
  await db.insert(s.enrolments).values({ studyId, patientId: p.id, siteId, studySubjectId: subject, consentDate: plan[0]!.date, withdrawnOn });
  return p.id;
}

async function csv(dataset: string): Promise<Record<string, string>[]> {
  const res = await getCsv(req("GET", `/api/exports/${dataset}?studyId=${studyId}`, nurse), ctx({ dataset }));
  expect(res.status).toBe(200);
  return parse(await res.text(), { columns: true }) as Record<string, string>[];
}

beforeAll(async () => {
  siteId = (await makeSite("Figures")).id;
  nurse = await actor("research_nurse", [siteId]);
  clinician = await actor("clinician", [siteId]);
  const [study] = await db.insert(s.studies).values({ code: `F-${siteId.slice(0, 6)}`, title: "Invented figures study", startDate: "2023-01-01" }).returning();
  studyId = study!.id;
  await db.insert(s.studySites).values({ studyId, siteId });
  // Treated, then clear, then back: clearance and a recurrence.
  await patientWith("FIG-1", [
    { date: "2023-03-01", lesions: [{ track: 0, grade: "hsil", treat: true }, { track: 1, grade: "lsil" }] },
    { date: "2023-09-01", lesions: [{ track: 1, grade: "lsil" }] },
    { date: "2024-03-01", lesions: [{ track: 0, grade: "hsil", histology: "hsil" }] },
  ]);
  // Treated, never clear; histology that outranks the impression.
  await patientWith("FIG-2", [
    { date: "2023-05-10", lesions: [{ track: 0, grade: "lsil", histology: "hsil", treat: true }] },
    { date: "2023-11-10", lesions: [{ track: 0, grade: "hsil" }] },
  ]);
  // Treated at the last visit: not followed.
  await patientWith("FIG-3", [{ date: "2024-01-20", lesions: [{ track: 0, grade: "hsil", treat: true }, { track: 1, grade: "condyloma" }] }]);
  // Withdrawn: the visit on the withdrawal day is never exported.
  await patientWith("FIG-4", [
    { date: "2023-06-01", lesions: [{ track: 0, grade: "hsil", treat: true }] },
    { date: "2024-06-01", lesions: [] },
  ], "2024-06-01");
  // An unsigned draft between two signed visits, its "not found" mark on the treated track: no
  // clearance, so HSIL at the next signed look is persistent, not recurrent (Liu 2018).
  await patientWith("FIG-5", [
    { date: "2023-04-01", lesions: [{ track: 0, grade: "hsil", treat: true }] },
    { date: "2023-10-01", draft: true, lesions: [], checks: [{ track: 0, outcome: "not_found" }] },
    { date: "2024-04-01", lesions: [{ track: 0, grade: "hsil" }] },
  ]);
  // Treated, then a signed visit where the treated site was not examined: no clearance.
  await patientWith("FIG-6", [
    { date: "2023-02-01", lesions: [{ track: 0, grade: "hsil", treat: true }] },
    { date: "2023-08-01", lesions: [], checks: [{ track: 0, outcome: "not_examined" }] },
  ]);
});

describe("study dashboard against the exports", () => {
  it("every figure equals the one worked out from the CSV exports of the same study", async () => {
    const [counts, lesions, outcomes] = [await csv("counts"), await csv("lesions"), await csv("outcomes")];
    const dash = await loadRegistryDashboard(studyId, [siteId]);

    expect(dash.visits).toBe(counts.length);
    expect(dash.lesions).toBe(counts.reduce((n, r) => n + Number(r.lesions), 0));
    expect(dash.lesions).toBe(lesions.length);
    // The grade chart counts each lesion at its effective grade: histology decides, else the
    // impression (decideGrade, the rule's TypeScript spec), from the lesions file's two columns.
    for (const g of GRADES) {
      const onScreen = dash.gradeByQuarter.reduce((n, q) => n + q[g], 0);
      const inFile = lesions.filter((r) => decideGrade(r.grade as Grade, (r.biopsy_histology || null) as Histology | null).grade === g).length;
      expect(onScreen, g).toBe(inFile);
    }
    // Patients still in the study: enrolled subjects minus the withdrawn one (FIG-4).
    expect(dash.patients).toBe(outcomes.length - 1);

    // A treated lesion is followed when its patient has a later exported visit, cleared when its
    // track's status at that next visit is cleared or regressed. The lesions file has no row for a
    // track nobody saw at a visit, so the next visit's status counts come from the counts file
    // (in this registry only treated tracks ever clear or regress, so the counts are theirs).
    const lastSeq = new Map<string, number>();
    for (const r of counts) lastSeq.set(r.study_id!, Math.max(lastSeq.get(r.study_id!) ?? 0, Number(r.visit_seq)));
    const visitRow = new Map(counts.map((r) => [`${r.study_id}@${r.visit_seq}`, r]));
    const treated = [...new Set(lesions.filter((r) => r.treatment_modality && !r.track_id!.endsWith("untracked")).map((r) => `${r.study_id}|${r.track_id}|${r.visit_seq}`))];
    const followed = treated.filter((t) => { const [sid, , seq] = t.split("|"); return Number(seq) < lastSeq.get(sid!)!; });
    const nextVisits = new Set(followed.map((t) => { const [sid, , seq] = t.split("|"); return `${sid}@${Number(seq) + 1}`; }));
    const cleared = [...nextVisits].reduce((n, k) => n + Number(visitRow.get(k)!.tracks_cleared) + Number(visitRow.get(k)!.tracks_regressed), 0);
    expect(dash.clearance.lesionsTreatedFollowed).toBe(followed.length);
    expect(dash.clearance.lesionsCleared).toBe(cleared);
    expect(cleared).toBeGreaterThan(0);
    expect(followed.length).toBeGreaterThan(0);

    // Per patient, from the outcomes file.
    expect(dash.clearance.patientsCleared).toBe(outcomes.filter((r) => r.days_treatment_to_clearance !== "").length);
    const inKm = outcomes.filter((r) => r.recurrence !== "");
    expect(dash.recurrence.patients).toBe(inKm.length);
    expect(dash.recurrence.events).toBe(inKm.filter((r) => r.recurrence === "1").length);
    expect(dash.recurrence.events).toBeGreaterThan(0);
  });

  it("counts signed visits only: a draft's mark clears nothing, and a visit that left the treated site unexamined is no clearance", async () => {
    const [counts, lesions, outcomes] = [await csv("counts"), await csv("lesions"), await csv("outcomes")];
    // FIG-5: the draft is not exported; the later signed HSIL is persistent at the treated site.
    expect(counts.filter((r) => r.study_id === "FIG-5").map((r) => r.visit_seq)).toEqual(["1", "2"]);
    expect(lesions.filter((r) => r.study_id === "FIG-5").map((r) => [r.visit_seq, r.track_status])).toEqual([["1", "new"], ["2", "persistent"]]);
    expect(outcomes.find((r) => r.study_id === "FIG-5")!.days_treatment_to_clearance).toBe("");
    // FIG-6: followed, not cleared, in the files and on the dashboard alike.
    const fig6 = counts.find((r) => r.study_id === "FIG-6" && r.visit_seq === "2")!;
    expect([fig6.tracks_cleared, fig6.tracks_regressed]).toEqual(["0", "0"]);
    expect(outcomes.find((r) => r.study_id === "FIG-6")!.days_treatment_to_clearance).toBe("");
    const dash = await loadRegistryDashboard(studyId, [siteId]);
    expect(dash.clearance.patientsCleared).toBe(outcomes.filter((r) => r.days_treatment_to_clearance !== "").length);
  });

  it("a newly signed visit shows after a load finds the figures over their age, and the page says when they are from", async () => {
    const before = await loadRegistryDashboard(studyId, [siteId]);
    const [e] = await db.select({ patientId: s.enrolments.patientId }).from(s.enrolments).where(and(eq(s.enrolments.studyId, studyId), eq(s.enrolments.studySubjectId, "FIG-3")));
    await db.insert(s.visits).values({ patientId: e!.patientId, siteId, visitDate: "2024-07-20", examinerId: clinician.userId, status: "signed", signedAt: new Date() });
    // Within the age (default 5 minutes): the stored figures, with their time, no refresh.
    const stored = await loadRegistryDashboard(studyId, [siteId]);
    expect(stored.visits).toBe(before.visits);
    expect(stored.asOf).toBe(before.asOf);
    expect(stored.refreshing).toBe(false);
    process.env.DENTATE_STUDY_FIGURES_MAX_AGE_S = "0";
    try {
      const stale = await loadRegistryDashboard(studyId, [siteId]);
      expect(stale.refreshing).toBe(true);
      expect(stale.visits).toBe(before.visits); // served at once, refreshed behind it
      await settleStoredFigures();
    } finally {
      delete process.env.DENTATE_STUDY_FIGURES_MAX_AGE_S;
    }
    const after = await loadRegistryDashboard(studyId, [siteId]);
    expect(after.visits).toBe(before.visits + 1);
    expect(after.clearance.patientsTreatedFollowed).toBe(before.clearance.patientsTreatedFollowed + 1);
    expect(Date.parse(after.asOf)).toBeGreaterThan(Date.parse(before.asOf));
  });


  it("a withdrawal recorded through the study page shows on the dashboard's next load, whatever the figures' age", async () => {
    const before = await loadRegistryDashboard(studyId, [siteId]);
    const [e] = await db.select({ id: s.enrolments.id }).from(s.enrolments).where(and(eq(s.enrolments.studyId, studyId), eq(s.enrolments.studySubjectId, "FIG-2")));
    await withdrawPatient({ userId: nurse.userId, siteIds: [siteId] }, studyId, e!.id, { withdrawnOn: "2024-12-01" }, "127.0.0.1");
    const after = await loadRegistryDashboard(studyId, [siteId]);
    expect(after.patients).toBe(before.patients - 1);
    expect(after.refreshing).toBe(false);
  });
});
