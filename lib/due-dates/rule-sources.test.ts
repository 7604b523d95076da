import { describe, expect, it } from "vitest";
import { FOLLOWUP_RULE_SOURCES } from "./rule-sources";
import { FOLLOWUP_RULE_KEYS } from "./rules";

describe("follow-up rule sources", () => {
  it("names a source or marks every rule as a local default", () => {
    for (const key of FOLLOWUP_RULE_KEYS) expect(FOLLOWUP_RULE_SOURCES[key].source.length).toBeGreaterThan(0);
  });
  it("does not cite Liu 2018 for the interval after a clear examination", () => {
    // Liu Y, Sigel K, Gaisa MM, Papillomavirus Res 2018;5:S9: "surveillance HRA within 12 months"
    // is about patients after treatment of HSIL, not about an untreated clear examination.
    const clear = FOLLOWUP_RULE_SOURCES.clear_exam.source;
    expect(clear).not.toMatch(/Liu/);
    expect(clear).toMatch(/local default|from memory/i);
  });
  it("cites Liu 2018's 12 months where it applies: surveillance after treatment", () => {
    // Liu 2018 (as above): surveillance HRA within 12 months after treatment of HSIL.
    expect(FOLLOWUP_RULE_SOURCES.after_hsil_treatment.source).toMatch(/Liu.*2018.*12 months|12 months.*Liu.*2018/);
  });
});
