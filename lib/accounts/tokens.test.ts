import { describe, expect, it } from "vitest";
import { expiryFrom, hashToken, INVITATION_TTL_MS, issueToken, looksLikeToken, RESET_TTL_MS } from "./tokens";

describe("link tokens", () => {
  it("hashes with SHA-256: the FIPS 180-4 test vector for 'abc'", () => {
    expect(hashToken("abc")).toBe("ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
  });

  it("issues 32 random bytes (256 bits) as 43 base64url characters (RFC 4648 §5), never the same twice", () => {
    const a = issueToken();
    const b = issueToken();
    expect(Buffer.from(a.token, "base64url")).toHaveLength(32);
    expect(looksLikeToken(a.token)).toBe(true);
    expect(a.token).not.toBe(b.token);
    expect(a.tokenHash).toBe(hashToken(a.token));
    expect(a.tokenHash).not.toContain(a.token);
  });

  it("expires invitations after 72 hours and resets after 1 hour (the brief's policy)", () => {
    const t0 = new Date("2026-03-01T10:00:00Z");
    expect(expiryFrom(t0, INVITATION_TTL_MS).toISOString()).toBe("2026-03-04T10:00:00.000Z");
    expect(expiryFrom(t0, RESET_TTL_MS).toISOString()).toBe("2026-03-01T11:00:00.000Z");
  });

  it("rejects anything that is not a token shape", () => {
    for (const bad of ["", "short", "a".repeat(44), "a".repeat(42) + "=", "../../etc/passwd"]) expect(looksLikeToken(bad)).toBe(false);
  });
});
