import { describe, expect, it } from "vitest";
import { originAllowed } from "./request-info";

// Same-origin rule for mutations: an origin is scheme + host + port (RFC 6454 §4, "The Web
// Origin Concept"); the Origin request header carries it (Fetch standard, §3.1 `Origin` header).
const h = (entries: Record<string, string>) => new Headers(entries);

describe("originAllowed", () => {
  it("accepts our own origin and refuses another host or a missing Origin", () => {
    expect(originAllowed(h({ origin: "https://clinic.example", host: "clinic.example" }))).toBe(true);
    expect(originAllowed(h({ origin: "https://evil.example", host: "clinic.example" }))).toBe(false);
    expect(originAllowed(h({ host: "clinic.example" }))).toBe(false);
    expect(originAllowed(h({ origin: "null", host: "clinic.example" }))).toBe(false);
  });

  it("a different port is a different origin (RFC 6454 §4)", () => {
    expect(originAllowed(h({ origin: "https://clinic.example:8443", host: "clinic.example" }))).toBe(false);
  });

  it("behind a proxy, the scheme must match the one the request arrived with", () => {
    const viaTls = { host: "clinic.example", "x-forwarded-proto": "https" };
    expect(originAllowed(h({ ...viaTls, origin: "https://clinic.example" }))).toBe(true);
    expect(originAllowed(h({ ...viaTls, origin: "http://clinic.example" }))).toBe(false);
    expect(originAllowed(h({ host: "clinic.example", "x-forwarded-proto": "https, http", origin: "https://clinic.example" }))).toBe(true);
  });

  it("uses the forwarded host when a proxy rewrites Host", () => {
    expect(originAllowed(h({ origin: "https://clinic.example", host: "10.0.0.5:3000", "x-forwarded-host": "clinic.example" }))).toBe(true);
  });
});
