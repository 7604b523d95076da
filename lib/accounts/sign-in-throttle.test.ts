import { describe, expect, it } from "vitest";
import { delaySeconds, delayTable, SIGN_IN_THROTTLE, SIGN_IN_WINDOW_SECONDS } from "./sign-in-throttle";

// OWASP Authentication Cheat Sheet, "Account Lockout": lockouts can be abused to deny service
// to a known account; an increasing delay after failures is the suggested alternative.
// OWASP ASVS 4.0.3 V2.2.1 and NIST SP 800-63B §5.2.2: no more than 100 failed attempts per
// hour on one account. (Both from memory.)
describe("sign-in throttle", () => {
  it("never locks an account outright: only an address has a hard limit", () => {
    expect(SIGN_IN_THROTTLE.account.hardLimit).toBeNull();
    expect(SIGN_IN_THROTTLE.address.hardLimit).toBeGreaterThan(0);
  });

  it("lets the first failures through at once, then doubles the wait up to its cap", () => {
    const p = SIGN_IN_THROTTLE.account;
    expect([0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 20].map((n) => delaySeconds(n, p))).toEqual([0, 0, 0, 1, 2, 4, 8, 16, 32, 60, 60]);
    expect(delayTable(p)).toEqual([0, 0, 0, 1, 2, 4, 8, 16, 32, 60]);
  });

  it("keeps one account under 100 failed guesses an hour, even from many addresses (ASVS V2.2.1)", () => {
    // The fastest a guesser can go: each attempt as soon as the previous one's delay has passed,
    // with the counter starting afresh whenever a 15-minute window has run out.
    const p = SIGN_IN_THROTTLE.account;
    let attempts = 0, count = 0, windowStart = 0, last = -Infinity;
    for (let t = 0; t < 3600; t++) {
      if (t - windowStart >= SIGN_IN_WINDOW_SECONDS) { windowStart = t; count = 0; }
      if (t < last + delaySeconds(count, p)) continue;
      count++; attempts++; last = t;
    }
    expect(attempts).toBeLessThanOrEqual(100);
    expect(attempts).toBeGreaterThan(20); // and yet a person who mistypes is not stopped for long
  });
});
