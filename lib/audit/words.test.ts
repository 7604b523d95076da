import { describe, expect, it } from "vitest";
import { detailWords, eventWords } from "./words";

describe("the audit trail in words", () => {
  it("reads event codes as sentences", () => {
    expect(eventWords("visit.treatments.read")).toBe("Visit treatments opened");
    expect(eventWords("sign_in.rate_limited")).toBe("Sign-in blocked for too many attempts");
    expect(eventWords("followup.rules_changed")).toBe("Follow-up rules changed");
    expect(eventWords("review.sign_off")).toBe("Review signed off");
    // A code not in the word lists still reads without dots or underscores.
    expect(eventWords("backup.made_offsite")).toBe("Backup made offsite");
  });

  it("reads the detail as labelled values, not JSON", () => {
    const text = detailWords({ before: {}, after: { clear_exam: 6 }, patientIds: ["a", "b"], withEpinephrine: false });
    expect(text).toBe("before: nothing · after: clear exam 6 · patient ids: a, b · with epinephrine: no");
    expect(text).not.toMatch(/[{}"]/);
  });
});
