import { describe, expect, it } from "vitest";
import { passwordLength, passwordProblem, PASSWORD_MAX_CHARS, PASSWORD_MIN_CHARS } from "./password-rules";

// NIST SP 800-63B-4 (2024) §3.1.1.2, as quoted in OWASP ASVS issue #3242: passwords used as a
// single factor SHALL be at least 15 characters; verifiers SHOULD permit at least 64; no
// composition rules; SHALL compare against a blocklist of commonly used or compromised values.
describe("password rules (NIST SP 800-63B-4)", () => {
  it("requires 15 characters when the password is the only factor", () => {
    expect(PASSWORD_MIN_CHARS).toBe(15);
    expect(passwordProblem("tangerine lamp7")).toBeNull(); // 15 characters
    expect(passwordProblem("tangerine lamp")).toMatch(/at least 15/); // 14
  });

  it("accepts at least 64 characters", () => {
    expect(PASSWORD_MAX_CHARS).toBeGreaterThanOrEqual(64);
    expect(passwordProblem("quiet harbour ".repeat(5).slice(0, 64))).toBeNull();
  });

  it("imposes no composition rule: all lower case letters and spaces pass", () => {
    expect(passwordProblem("oak river lantern copper")).toBeNull();
  });

  it("counts Unicode code points, not UTF-16 units (SP 800-63B: each code point is one character)", () => {
    expect(passwordLength("🦷🦷🦷")).toBe(3);
    expect(passwordProblem("🦷".repeat(14) + "x")).toBeNull();
  });

  it("refuses passwords on the common list, also when repeated or padded", () => {
    // "password" and "baseball" are in every published top-10 list of leaked passwords.
    expect(passwordProblem("passwordpassword")).toMatch(/commonly used/);
    expect(passwordProblem("baseball2024!!!!")).toMatch(/commonly used/);
  });

  it("refuses context words: the service name and the person's own address or name (SP 800-63B context-specific words)", () => {
    expect(passwordProblem("my dentate secret key", {})).toMatch(/name of this service/);
    expect(passwordProblem("okafor likes long walks", { email: "okafor@clinic.example" })).toMatch(/e-mail/);
    expect(passwordProblem("lindqvist at the harbour", { displayName: "Dr Priya Lindqvist" })).toMatch(/name/);
  });

  it("refuses one repeated character", () => {
    expect(passwordProblem("zzzzzzzzzzzzzzzzzz")).not.toBeNull();
  });
});
