import { describe, expect, it } from "vitest";
import { createHash } from "node:crypto";
import { isUuid, resourceUuid, sha1Hex, uuidV5 } from "./uuid";

describe("uuidV5", () => {
  it("reproduces the SHA-1 test vector of FIPS 180", () => {
    // FIPS 180-4 example "abc".
    expect(sha1Hex("abc")).toBe("a9993e364706816aba3e25717850c26c9cd0d89d");
  });
  it("agrees with Node's SHA-1 on multi-block and non-ASCII input", () => {
    for (const text of ["", "x".repeat(55), "x".repeat(56), "y".repeat(200), "Ödem-Länge 3 o'clock"]) {
      expect(sha1Hex(text)).toBe(createHash("sha1").update(text, "utf8").digest("hex"));
    }
  });
  it("reproduces the Python documentation's uuid5 example", () => {
    // Python docs, uuid module: uuid5(NAMESPACE_DNS, 'python.org') == 886313e1-3b8a-5372-9b90-0c9aee199e5d.
    expect(uuidV5("python.org", "6ba7b810-9dad-11d1-80b4-00c04fd430c8")).toBe("886313e1-3b8a-5372-9b90-0c9aee199e5d");
  });
  it("gives distinct valid ids to resources derived from one row", () => {
    const a = resourceUuid("Procedure", "b1");
    const b = resourceUuid("DiagnosticReport", "b1");
    expect(isUuid(a) && isUuid(b)).toBe(true);
    expect(a).not.toBe(b);
  });
});
