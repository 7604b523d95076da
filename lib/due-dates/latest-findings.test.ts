import { describe, expect, it } from "vitest";
import { summariseLatestFindings } from "./latest-findings";
import { nextDue } from "./rules";

const base = { visitDate: "2025-03-10", lesions: [], trackGrades: [], cytology: "not_done" as const, treatments: [] };

describe("latest findings for the follow-up rules", () => {
  it("an HSIL treated at the latest visit gives the post-treatment interval: 3 months (Goldstone 2005, 3-6 months; lower bound)", () => {
    const f = summariseLatestFindings({ ...base, lesions: [{ grade: "hsil" }], treatments: [{ visitDate: "2025-03-10", grade: "hsil", histology: null }] });
    expect(nextDue({ lastVisitDate: "2025-03-10", findings: f }).dueDate).toBe("2025-06-10");
  });

  it("a clear visit 4 months after HSIL treatment stays under post-treatment surveillance (Liu 2018: surveillance in the first 12 months)", () => {
    const f = summariseLatestFindings({ ...base, treatments: [{ visitDate: "2024-11-10", grade: "hsil", histology: "hsil" }] });
    expect(f.treatedHsil).toBe(true);
  });

  it("a treatment more than 12 months before the latest visit no longer counts; a clear exam waits 12 months (Liu 2018)", () => {
    const f = summariseLatestFindings({ ...base, treatments: [{ visitDate: "2024-01-10", grade: "hsil", histology: "hsil" }] });
    expect(f.treatedHsil).toBe(false);
    expect(nextDue({ lastVisitDate: "2025-03-10", findings: f }).dueDate).toBe("2026-03-10");
  });

  it("a treated lesion whose histology came back LSIL is not an HSIL treatment (LAST: LSIL is low grade)", () => {
    const f = summariseLatestFindings({ ...base, treatments: [{ visitDate: "2025-03-10", grade: "hsil", histology: "lsil" }] });
    expect(f.treatedHsil).toBe(false);
  });

  it("track effective grades count as findings: an HSIL track makes the visit HSIL", () => {
    const f = summariseLatestFindings({ ...base, lesions: [{ grade: "lsil" }], trackGrades: ["hsil"] });
    expect(nextDue({ lastVisitDate: "2025-03-10", findings: f }).ruleKey).toBe("hsil_untreated");
  });

  it("abnormal cytology with no lesion picks its own rule (Bethesda ASC-US is abnormal)", () => {
    const f = summariseLatestFindings({ ...base, cytology: "asc_us" });
    expect(nextDue({ lastVisitDate: "2025-03-10", findings: f }).ruleKey).toBe("abnormal_cytology_normal_exam");
  });
});
