import { describe, expect, it } from "vitest";
import type { Grade, Histology } from "@/lib/domain/vocab";
import { trackStatuses, type TrackObservation } from "./status";

// Invented visits. Builders keep each scenario readable as a row of sightings.
let n = 0;
function seen(date: string, grade: Grade, extra: Partial<TrackObservation> = {}): TrackObservation {
  return { visitId: `v${++n}`, visitDate: date, seen: true, impressionGrade: grade, treatedAtVisit: false, lookedFor: true, ...extra };
}
function notFound(date: string, extra: Partial<TrackObservation> = {}): TrackObservation {
  return { visitId: `v${++n}`, visitDate: date, seen: false, treatedAtVisit: false, lookedFor: true, ...extra };
}
const treated = { treatedAtVisit: true };
const histology = (h: Histology) => ({ histology: h });
const statuses = (obs: TrackObservation[], ctx = {}) => trackStatuses(obs, ctx).map((s) => s.status);

describe("track status after treatment", () => {
  // Recurrence after a documented clear visit: common practice, no single source (Liu Y et al., Papillomavirus Res 2018);
  // resolution judged at follow-up, recurrence at later visits (Richel O et al., Lancet Oncol 2013).
  it("treated HSIL, not found twice, then found again = new, cleared, cleared, recurrent", () => {
    const obs = [seen("2023-01-10", "hsil", treated), notFound("2023-07-10"), notFound("2024-01-10"), seen("2024-07-10", "hsil")];
    const out = trackStatuses(obs);
    expect(out.map((s) => s.status)).toEqual(["new", "cleared", "cleared", "recurrent"]);
    expect(out[3].reason).toContain("2023-07-10"); // names the clear visit
    expect(out[3].reason).toContain("HSIL");
  });

  // Persistent HSIL = HSIL in the same region at the first look after treatment (Liu Y, Sigel K,
  // Gaisa MM, Papillomavirus Research 2018;5:S9).
  it("HSIL found at the first visit after treatment is persistent", () => {
    const out = trackStatuses([seen("2023-01-10", "hsil", treated), seen("2023-05-02", "hsil")]);
    expect(out.map((s) => s.status)).toEqual(["new", "persistent"]);
    expect(out[1].reason).toContain("first look after treatment of HSIL at 2023-01-10");
  });

  // Liu 2018 defines persistence at the treated site; a worse grade there is progression
  // (GRADE_RANK, common practice, no source).
  it("suspected cancer at the first visit after treated HSIL is progressed", () => {
    expect(statuses([seen("2023-01-10", "hsil", treated), seen("2023-05-02", "suspected_cancer")])).toEqual(["new", "progressed"]);
  });

  // Our documented choice: a benign finding counts as clear. Treated HSIL whose follow-up biopsy is
  // benign is cleared even though the impression was HSIL (histology decides: LAST, Darragh 2012).
  it("treated HSIL with benign follow-up histology is cleared", () => {
    const out = trackStatuses([seen("2023-01-10", "hsil", treated), seen("2023-05-02", "hsil", histology("benign"))]);
    expect(out.map((s) => s.status)).toEqual(["new", "cleared"]);
    expect(out[1].effectiveGrade).toBe("benign");
    expect(out[1].reason).toContain("histology benign overrides impression HSIL");
  });
});

describe("metachronous disease", () => {
  // Metachronous = HSIL in a different region after treatment of the index lesion (Liu 2018).
  it("HSIL at a different site after earlier treated disease is new, flagged metachronous", () => {
    const out = trackStatuses([notFound("2023-01-10"), seen("2023-07-10", "hsil")], { earlierDiseaseElsewhere: true });
    expect(out.map((s) => s.status)).toEqual([null, "new"]);
    expect(out[1].reason).toContain("metachronous: new site after earlier disease");
  });
  it("a first lesion without earlier disease is new and not called metachronous", () => {
    const out = trackStatuses([seen("2023-07-10", "hsil")]);
    expect(out[0].status).toBe("new");
    expect(out[0].reason).not.toContain("metachronous");
  });
});

describe("untreated course", () => {
  // LAST two tiers, HSIL above LSIL (Darragh TM et al., Arch Pathol Lab Med 2012); a rise in grade
  // at an untreated site is progression: common practice, no source.
  it("LSIL that becomes HSIL is progressed", () => {
    const out = trackStatuses([seen("2023-01-10", "lsil"), seen("2023-07-10", "hsil")]);
    expect(out.map((s) => s.status)).toEqual(["new", "progressed"]);
    expect(out[1].reason).toMatch(/HSIL.*LSIL at 2023-01-10/);
  });
  it("same grade again untreated is persistent, lower grade is regressed", () => {
    expect(statuses([seen("2023-01-10", "hsil"), seen("2023-07-10", "hsil"), seen("2024-01-10", "lsil")])).toEqual([
      "new",
      "persistent",
      "regressed",
    ]);
  });
  // Spontaneous regression of untreated lesions is common practice to record, no source.
  it("untreated lesion not found is regressed, not cleared", () => {
    const out = trackStatuses([seen("2023-01-10", "lsil"), notFound("2023-07-10")]);
    expect(out.map((s) => s.status)).toEqual(["new", "regressed"]);
    expect(out[1].reason).toContain("untreated");
  });
  it("a site not examined gets no status rather than a guess", () => {
    expect(statuses([seen("2023-01-10", "lsil"), notFound("2023-07-10", { lookedFor: false })])).toEqual(["new", null]);
  });
});

describe("histology decides the grade", () => {
  // LAST (Darragh 2012): the histological diagnosis is the reference; Hillman RJ et al., J Low Genit Tract Dis 2016.
  it("impression LSIL with histology HSIL counts as HSIL", () => {
    const out = trackStatuses([seen("2023-01-10", "lsil", histology("hsil"))]);
    expect(out[0].effectiveGrade).toBe("hsil");
    expect(out[0].reason).toContain("histology HSIL overrides impression LSIL");
  });
  it("impression HSIL with benign histology counts as benign, so an untreated track regresses", () => {
    const out = trackStatuses([seen("2023-01-10", "lsil"), seen("2023-07-10", "hsil", histology("benign"))]);
    expect(out[1]).toMatchObject({ status: "regressed", effectiveGrade: "benign" });
  });
  it("histology progression from LSIL to HSIL overrides a steady impression", () => {
    expect(statuses([seen("2023-01-10", "lsil"), seen("2023-07-10", "lsil", histology("hsil"))])).toEqual(["new", "progressed"]);
  });
});

describe("condyloma and LSIL are one tier", () => {
  // LAST (Darragh TM et al., Arch Pathol Lab Med 2012;136:1266-97): condyloma is a low-grade squamous
  // intraepithelial lesion, so condyloma -> LSIL and LSIL -> condyloma are neither progression nor regression.
  it("condyloma then LSIL is persistent, not progressed", () => {
    expect(statuses([seen("2023-01-10", "condyloma"), seen("2023-07-10", "lsil")])).toEqual(["new", "persistent"]);
  });
  it("LSIL then condyloma is persistent, not regressed", () => {
    expect(statuses([seen("2023-01-10", "lsil"), seen("2023-07-10", "condyloma")])).toEqual(["new", "persistent"]);
  });
  it("condyloma then HSIL is still progressed (LAST: HSIL is the higher tier)", () => {
    expect(statuses([seen("2023-01-10", "condyloma"), seen("2023-07-10", "hsil")])).toEqual(["new", "progressed"]);
  });
});

describe("a treated lesion seen at a lower grade at the first look", () => {
  // Liu Y, Sigel K, Gaisa MM, Papillomavirus Research 2018;5:S9: disease at the treated site at the
  // first look after treatment is persistence. A lower grade there is not the untreated regression
  // the word "regressed" means, so the status stays persistent and the reason names the lower grade.
  it("treated HSIL, LSIL at the first look = persistent (lower grade), not regressed", () => {
    const out = trackStatuses([seen("2023-01-10", "hsil", treated), seen("2023-05-02", "lsil")]);
    expect(out.map((s) => s.status)).toEqual(["new", "persistent"]);
    expect(out[1].effectiveGrade).toBe("lsil");
    expect(out[1].reason).toContain("persistent at a lower grade than the HSIL treated");
  });
  it("untreated HSIL then LSIL is still regressed", () => {
    expect(statuses([seen("2023-01-10", "hsil"), seen("2023-05-02", "lsil")])).toEqual(["new", "regressed"]);
  });
});
