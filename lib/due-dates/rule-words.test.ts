import { describe, expect, it } from "vitest";
import { RULE_WORDS } from "./rule-words";
import { FOLLOWUP_RULE_KEYS } from "./rules";

describe("follow-up rule words", () => {
  it("names a source or marks every rule as a local default", () => {
    for (const key of FOLLOWUP_RULE_KEYS) expect(RULE_WORDS[key].basis.length).toBeGreaterThan(0);
  });
  it("does not cite Liu 2018 for the interval after a clear examination", () => {
    // Liu Y, Sigel K, Gaisa MM, Papillomavirus Res 2018;5:S9: "surveillance HRA within 12 months"
    // is about patients after treatment of HSIL, not about an untreated clear examination.
    const clear = RULE_WORDS.clear_exam.basis;
    expect(clear).not.toMatch(/Liu/);
    expect(clear).toMatch(/local default/i);
  });
  it("cites Liu 2018's 12 months where it applies: surveillance after treatment", () => {
    // Liu 2018 (as above): surveillance HRA within 12 months after treatment of HSIL.
    expect(RULE_WORDS.after_hsil_treatment.basis).toMatch(/Liu.*2018.*12 months|12 months.*Liu.*2018/);
  });
});
