import { describe, expect, it } from "vitest";
import { NextRequest } from "next/server";
import { proxy, config } from "@/proxy";

// Content-Security-Policy nonces: MDN "CSP: script-src" (a nonce must be unguessable and new for
// every response); the request header is how Next.js learns the nonce for its own scripts (Next.js
// docs, "Content Security Policy", adding a nonce with Proxy). From memory.
function nonceOf(csp: string | null): string | undefined {
  return csp?.match(/'nonce-([^']+)'/)?.[1];
}

describe("proxy.ts (pages and server actions)", () => {
  it("sets a fresh nonce per request, the same in the page's policy and in the header Next reads", () => {
    const a = proxy(new NextRequest("http://dentate.test/patients"));
    const b = proxy(new NextRequest("http://dentate.test/patients"));
    const csp = a.headers.get("content-security-policy");
    const nonce = nonceOf(csp);
    expect(nonce).toMatch(/^[A-Za-z0-9+/]{22}==$/);
    expect(nonceOf(b.headers.get("content-security-policy"))).not.toBe(nonce);
    // NextResponse.next({ request: { headers } }) hands the request headers over in these.
    expect(nonceOf(a.headers.get("x-middleware-request-content-security-policy"))).toBe(nonce);
    expect(a.headers.get("x-middleware-request-x-nonce")).toBe(nonce);
    expect(csp).toMatch(/script-src 'self' 'nonce-[^']+' 'strict-dynamic'(;|$)/);
    expect(csp).toMatch(/frame-ancestors 'none'/);
    expect(csp).toMatch(/object-src 'none'/);
    expect(csp).not.toMatch(/script-src[^;]*'unsafe-inline'/);
  });

  it("sets the other security headers, and HSTS only when the public address is https", () => {
    const saved = process.env.APP_BASE_URL;
    try {
      process.env.APP_BASE_URL = "http://127.0.0.1:3000";
      const plain = proxy(new NextRequest("http://dentate.test/sign-in"));
      expect(plain.headers.get("x-frame-options")).toBe("DENY");
      expect(plain.headers.get("x-content-type-options")).toBe("nosniff");
      expect(plain.headers.get("referrer-policy")).toBe("same-origin");
      expect(plain.headers.get("permissions-policy")).toMatch(/camera=\(\)/);
      expect(plain.headers.get("strict-transport-security")).toBeNull();
      process.env.APP_BASE_URL = "https://dentate.clinic.example";
      const tls = proxy(new NextRequest("http://dentate.test/sign-in"));
      expect(tls.headers.get("strict-transport-security")).toMatch(/^max-age=63072000/);
      expect(tls.headers.get("content-security-policy")).toMatch(/upgrade-insecure-requests/);
    } finally {
      process.env.APP_BASE_URL = saved;
    }
  });

  it("runs on pages but not on the API or Next's static files", () => {
    const re = new RegExp(`^${config.matcher[0]!.source}$`);
    expect(re.test("/patients/3f0c")).toBe(true);
    expect(re.test("/")).toBe(true);
    expect(re.test("/api/patients")).toBe(false);
    expect(re.test("/_next/static/chunks/a.js")).toBe(false);
  });
});
