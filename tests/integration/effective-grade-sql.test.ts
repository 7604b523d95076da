// One rule for the grade a sighting counts as: histology, when there is one, overrides the exam
// impression (LAST: Darragh TM et al., Arch Pathol Lab Med 2012;136:1266-97). lib/tracking is the
// specification; the SQL functions the exports and dashboard use are checked against it here, and
// the outcomes export is checked on records where impression and histology disagree.
import { beforeAll, describe, expect, it } from "vitest";
import { parse } from "csv-parse/sync";
import { db, sql } from "@/db/client";
import * as s from "@/db/schema";
import { GRADES, GRADE_TIER, HISTOLOGY, type Grade, type Histology } from "@/lib/domain/vocab";
import { decideGrade } from "@/lib/tracking/effective-grade";
import { OUTCOME_COLUMNS } from "@/lib/exports/data-dictionary";
import { GET as getCsv } from "@/app/api/exports/[dataset]/route";
import { actor, ctx, makePatient, makeSite, req, type Actor } from "../fixtures/factory";

describe("dentate_effective_grade and dentate_grade_tier agree with lib/tracking", () => {
  it("gives the same grade as decideGrade for every impression x histology (or none)", async () => {
    const cases = GRADES.flatMap((g) => [null, ...HISTOLOGY].map((h) => [g, h] as const));
    for (const [g, h] of cases) {
      const [row] = await sql<{ grade: Grade }[]>`SELECT dentate_effective_grade(${g}::grade, ${h}::histology) AS grade`;
      expect(row!.grade, `${g} + ${h}`).toBe(decideGrade(g, h as Histology | null).grade);
    }
  });
  it("gives the same tier as GRADE_TIER for every grade", async () => {
    for (const g of GRADES) {
      const [row] = await sql<{ tier: number }[]>`SELECT dentate_grade_tier(${g}::grade) AS tier`;
      expect(row!.tier, g).toBe(GRADE_TIER[g]);
    }
  });
});

describe("the outcomes export counts by the effective grade", () => {
  let studyId: string;
  let nurse: Actor;

  async function subject(code: string, siteId: string, examinerId: string, grade: Grade, histology: Histology | null) {
    const p = await makePatient(siteId, { dateOfBirth: "1970-01-01", consentResearch: true });
    const [t] = await db.insert(s.lesionTracks).values({ patientId: p.id, siteId, label: "#1" }).returning({ id: s.lesionTracks.id });
    const [v] = await db.insert(s.visits).values({ patientId: p.id, siteId, visitDate: "2024-03-01", examinerId, status: "signed", signedAt: new Date() }).returning({ id: s.visits.id });
    const [l] = await db.insert(s.lesions).values({
      visitId: v!.id, siteId, trackId: t!.id, label: "L1", clockStartH: 3, clockEndH: 4, distanceStartCm: 1, distanceEndCm: 2, zone: "transformation_zone", grade,
    }).returning({ id: s.lesions.id });
    if (histology) await db.insert(s.biopsies).values({ visitId: v!.id, siteId, lesionId: l!.id, specimenLabel: "A", clockH: 3.5, distanceCm: 1.5, histology });
    await db.insert(s.enrolments).values({ studyId, patientId: p.id, siteId, studySubjectId: code, consentDate: "2024-03-01" });
  }

  beforeAll(async () => {
    const site = (await makeSite("Grades")).id;
    nurse = await actor("research_nurse", [site]);
    const clinician = await actor("clinician", [site]);
    const [study] = await db.insert(s.studies).values({ code: `EG-${site.slice(0, 6)}`, title: "Invented grade study", startDate: "2024-01-01" }).returning();
    studyId = study!.id;
    await db.insert(s.studySites).values({ studyId, siteId: site });
    await subject("EG-1", site, clinician.userId, "suspected_cancer", "benign");
    await subject("EG-2", site, clinician.userId, "lsil", "hsil");
    await subject("EG-3", site, clinician.userId, "hsil", "lsil");
    await subject("EG-4", site, clinician.userId, "hsil", "scc");
  });

  async function outcomes() {
    const res = await getCsv(req("GET", `/api/exports/outcomes?studyId=${studyId}`, nurse), ctx({ dataset: "outcomes" }));
    expect(res.status).toBe(200);
    return new Map((parse(await res.text(), { columns: true }) as Record<string, string>[]).map((r) => [r.study_id, r]));
  }

  it("does not count suspected cancer with benign histology as cancer or HSIL", async () => {
    const r = (await outcomes()).get("EG-1")!;
    expect(r.progressed_to_cancer).toBe("0");
    expect(r.first_hsil_day).toBe("");
  });
  it("counts LSIL on impression with HSIL on histology as HSIL, and HSIL with LSIL histology as not", async () => {
    const rows = await outcomes();
    expect(rows.get("EG-2")!.first_hsil_day).toBe("0");
    expect(rows.get("EG-3")!.first_hsil_day).toBe("");
  });
  it("counts SCC on histology as cancer", async () => {
    expect((await outcomes()).get("EG-4")!.progressed_to_cancer).toBe("1");
  });
});

describe("the outcomes export offers both recurrences, each worded in the data dictionary", () => {
  // Recurrence after a clear visit (column recurrence) vs overall recurrence = persistent +
  // metachronous (Liu Y, Sigel K, Gaisa MM, Papillomavirus Research 2018;5:S9; column hsil_after_treatment).
  let studyId: string;
  let nurse: Actor;
  let site: string;
  let examiner: string;

  /** One enrolled subject; each visit is a grade (or null = clear) and whether it was treated. */
  async function subject(code: string, visitsSpec: { date: string; grade: Grade | null; treat?: boolean }[]) {
    const p = await makePatient(site, { dateOfBirth: "1975-01-01", consentResearch: true });
    const [t] = await db.insert(s.lesionTracks).values({ patientId: p.id, siteId: site, label: "#1" }).returning({ id: s.lesionTracks.id });
    for (const v of visitsSpec) {
      const [row] = await db.insert(s.visits).values({ patientId: p.id, siteId: site, visitDate: v.date, examinerId: examiner, status: "signed", signedAt: new Date() }).returning({ id: s.visits.id });
      if (!v.grade) continue;
      const [l] = await db.insert(s.lesions).values({
        visitId: row!.id, siteId: site, trackId: t!.id, label: "L1", clockStartH: 3, clockEndH: 4, distanceStartCm: 1, distanceEndCm: 2, zone: "transformation_zone", grade: v.grade,
      }).returning({ id: s.lesions.id });
      if (v.treat) await db.insert(s.treatments).values({ visitId: row!.id, siteId: site, lesionId: l!.id, modality: "electrocautery", arcs: [{ startH: 3, endH: 4 }], treatedFraction: 1 / 12 });
    }
    await db.insert(s.enrolments).values({ studyId, patientId: p.id, siteId: site, studySubjectId: code, consentDate: visitsSpec[0]!.date });
  }

  beforeAll(async () => {
    site = (await makeSite("Recurrence")).id;
    nurse = await actor("research_nurse", [site]);
    examiner = (await actor("clinician", [site])).userId;
    const [study] = await db.insert(s.studies).values({ code: `RC-${site.slice(0, 6)}`, title: "Invented recurrence study", startDate: "2024-01-01" }).returning();
    studyId = study!.id;
    await db.insert(s.studySites).values({ studyId, siteId: site });
    await subject("RC-1", [{ date: "2024-01-10", grade: "hsil", treat: true }, { date: "2024-05-10", grade: null }, { date: "2024-11-10", grade: "hsil" }]);
    await subject("RC-2", [{ date: "2024-01-10", grade: "hsil", treat: true }, { date: "2024-05-10", grade: "hsil" }]);
    await subject("RC-3", [{ date: "2024-01-10", grade: "hsil", treat: true }, { date: "2024-05-10", grade: "lsil" }]);
  });

  async function rows() {
    const res = await getCsv(req("GET", `/api/exports/outcomes?studyId=${studyId}`, nurse), ctx({ dataset: "outcomes" }));
    expect(res.status).toBe(200);
    return parse(await res.text(), { columns: true }) as Record<string, string>[];
  }

  it("counts HSIL after a clear visit as both; HSIL at the first look (persistent) only as overall recurrence", async () => {
    const byId = new Map((await rows()).map((r) => [r.study_id, r]));
    expect(byId.get("RC-1")).toMatchObject({ recurrence: "1", hsil_after_treatment: "1" });
    expect(byId.get("RC-2")).toMatchObject({ recurrence: "", hsil_after_treatment: "1" });
    expect(byId.get("RC-3")).toMatchObject({ recurrence: "0", hsil_after_treatment: "0" });
  });

  it("words every column of the de-identified outcomes export in the data dictionary", async () => {
    for (const column of Object.keys((await rows())[0]!)) expect(OUTCOME_COLUMNS[column], column).toBeTruthy();
  });
});
