import { afterEach, describe, expect, it, vi } from "vitest";
import { z } from "zod";
import { newClientKey } from "./client-key";

// RFC 9562 §5.4 (UUID version 4): xxxxxxxx-xxxx-4xxx-[89ab]xxx-xxxxxxxxxxxx, lower-case hex.
const realCrypto = globalThis.crypto;
const V4 = /^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/;

describe("newClientKey", () => {
  afterEach(() => vi.unstubAllGlobals());

  it("builds a version-4 UUID by hand where randomUUID is missing (plain http), accepted by the server's schema", () => {
    vi.stubGlobal("crypto", { getRandomValues: (a: Uint8Array) => realCrypto.getRandomValues(a) });
    const keys = Array.from({ length: 200 }, newClientKey);
    for (const k of keys) {
      expect(k).toMatch(V4);
      expect(z.string().uuid().safeParse(k).success).toBe(true);
    }
    expect(new Set(keys).size).toBe(keys.length);
  });

  it("sets the version and variant bits whatever the random bytes are", () => {
    // All bits set and all bits clear: the two cases where a missing mask would show.
    for (const fill of [0xff, 0x00]) {
      vi.stubGlobal("crypto", { getRandomValues: (a: Uint8Array) => a.fill(fill) });
      expect(newClientKey()).toMatch(V4);
    }
  });
});
