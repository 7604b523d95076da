import { describe, expect, it } from "vitest";
import { clientIp, isHttps, originAllowed, PEER_HEADER, PEER_PROTO_HEADER } from "./request-info";

// Same-origin rule for mutations: an origin is scheme + host + port (RFC 6454 §4, "The Web
// Origin Concept"); the Origin request header carries it (Fetch standard, §3.1 `Origin` header).
const h = (entries: Record<string, string>) => new Headers(entries);
const direct = {}; // no proxy trusted: the default
const oneProxy = { DENTATE_TRUSTED_PROXY_HOPS: "1" };

describe("originAllowed", () => {
  it("accepts our own origin and refuses another host or a missing Origin", () => {
    const own = { host: "clinic.example", [PEER_PROTO_HEADER]: "https" };
    expect(originAllowed(h({ ...own, origin: "https://clinic.example" }), direct)).toBe(true);
    expect(originAllowed(h({ ...own, origin: "https://evil.example" }), direct)).toBe(false);
    expect(originAllowed(h(own), direct)).toBe(false);
    expect(originAllowed(h({ ...own, origin: "null" }), direct)).toBe(false);
  });

  it("a different port is a different origin (RFC 6454 §4)", () => {
    expect(originAllowed(h({ origin: "https://clinic.example:8443", host: "clinic.example", [PEER_PROTO_HEADER]: "https" }), direct)).toBe(false);
  });

  it("behind a trusted proxy, the scheme must match the one the request arrived with", () => {
    const viaTls = { host: "clinic.example", "x-forwarded-proto": "https" };
    expect(originAllowed(h({ ...viaTls, origin: "https://clinic.example" }), oneProxy)).toBe(true);
    expect(originAllowed(h({ ...viaTls, origin: "http://clinic.example" }), oneProxy)).toBe(false);
  });

  it("uses the forwarded host only when a proxy is trusted to write it", () => {
    const rewritten = { origin: "https://clinic.example", host: "10.0.0.5:3000", "x-forwarded-host": "clinic.example", "x-forwarded-proto": "https" };
    expect(originAllowed(h(rewritten), oneProxy)).toBe(true);
    expect(originAllowed(h({ ...rewritten, [PEER_PROTO_HEADER]: "https" }), direct)).toBe(false);
  });

  it("ignores forwarding headers a client sends when no proxy is trusted: they cannot switch the check off", () => {
    // A page on evil.example posts with forged X-Forwarded-Host/-Proto naming itself.
    const forged = { origin: "http://evil.example", host: "clinic.example", "x-forwarded-host": "evil.example", "x-forwarded-proto": "http", [PEER_PROTO_HEADER]: "https" };
    expect(originAllowed(h(forged), direct)).toBe(false);
  });

  it("accepts the configured public address as our origin", () => {
    const env = { APP_BASE_URL: "https://clinic.example/" };
    expect(originAllowed(h({ origin: "https://clinic.example", host: "127.0.0.1:3000", [PEER_PROTO_HEADER]: "http" }), env)).toBe(true);
    expect(originAllowed(h({ origin: "https://other.example", host: "127.0.0.1:3000", [PEER_PROTO_HEADER]: "http" }), env)).toBe(false);
  });
});

// The right-most-untrusted rule for X-Forwarded-For: MDN, "X-Forwarded-For", Security and
// privacy concerns (choose the right-most untrusted address; left-most entries are client-made).
describe("clientIp", () => {
  it("with no proxy trusted, is the socket's peer whatever X-Forwarded-For and X-Real-IP say", () => {
    const headers = h({ "x-forwarded-for": "203.0.113.9", "x-real-ip": "203.0.113.10", [PEER_HEADER]: "198.51.100.4" });
    expect(clientIp(headers, direct)).toBe("198.51.100.4");
  });

  it("behind one trusted proxy, is the right-most X-Forwarded-For entry, never a left-most one the client wrote", () => {
    const headers = h({ "x-forwarded-for": "203.0.113.9, 192.0.2.77", [PEER_HEADER]: "10.0.0.2" });
    expect(clientIp(headers, oneProxy)).toBe("192.0.2.77");
  });

  it("behind two trusted proxies, skips both of their entries", () => {
    const headers = h({ "x-forwarded-for": "203.0.113.9, 192.0.2.77, 10.0.0.3", [PEER_HEADER]: "10.0.0.2" });
    expect(clientIp(headers, { DENTATE_TRUSTED_PROXY_HOPS: "2" })).toBe("192.0.2.77");
  });

  it("refuses a malformed hop count instead of guessing", () => {
    expect(() => clientIp(h({}), { DENTATE_TRUSTED_PROXY_HOPS: "yes" })).toThrow(/DENTATE_TRUSTED_PROXY_HOPS/);
  });
});

describe("isHttps (the session cookie's Secure flag)", () => {
  it("is true whenever the public address is https, even when nothing in the request says so", () => {
    expect(isHttps(h({ [PEER_PROTO_HEADER]: "http" }), { APP_BASE_URL: "https://clinic.example" })).toBe(true);
  });

  it("does not take a client's X-Forwarded-Proto when no proxy is trusted", () => {
    expect(isHttps(h({ "x-forwarded-proto": "https", [PEER_PROTO_HEADER]: "http" }), { APP_BASE_URL: "http://127.0.0.1:3000" })).toBe(false);
    expect(isHttps(h({ "x-forwarded-proto": "https" }), { APP_BASE_URL: "http://x", DENTATE_TRUSTED_PROXY_HOPS: "1" })).toBe(true);
  });
});
