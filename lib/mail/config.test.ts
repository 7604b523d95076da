import { describe, expect, it } from "vitest";
import { mailConfigFrom, messageIdFor, retryDelayMs, senderDomain } from "./config";

describe("mail configuration", () => {
  it("defaults to a loopback fake server without TLS or auth", () => {
    const c = mailConfigFrom({});
    expect(c).toMatchObject({ host: "127.0.0.1", port: 1025, secure: false, auth: undefined });
  });

  it("reads a real deployment's settings", () => {
    const c = mailConfigFrom({ SMTP_HOST: "smtp.clinic.example", SMTP_PORT: "465", SMTP_SECURE: "true", SMTP_USER: "u", SMTP_PASS: "p", MAIL_FROM: "Clinic <noreply@clinic.example>", APP_BASE_URL: "https://dentate.clinic.example/" });
    expect(c).toMatchObject({ host: "smtp.clinic.example", port: 465, secure: true, auth: { user: "u", pass: "p" }, appBaseUrl: "https://dentate.clinic.example" });
  });

  it("refuses half a login and a port outside 1-65535 (TCP port range, RFC 793)", () => {
    expect(() => mailConfigFrom({ SMTP_USER: "u" })).toThrow();
    expect(() => mailConfigFrom({ SMTP_PORT: "70000" })).toThrow();
  });
});

describe("Message-ID", () => {
  it("is the same for the same key and has the RFC 5322 §3.6.4 form <left@right>", () => {
    const a = messageIdFor("invitation:1", senderDomain("Dentate <no-reply@dentate.example>"));
    expect(a).toBe(messageIdFor("invitation:1", "dentate.example"));
    expect(a).toMatch(/^<[0-9a-f]{32}@dentate\.example>$/);
    expect(messageIdFor("invitation:2", "dentate.example")).not.toBe(a);
  });
});

describe("retry delay", () => {
  it("doubles from 30 s and stops growing at one hour (exponential backoff: common practice, no source)", () => {
    expect([1, 2, 3, 4].map(retryDelayMs)).toEqual([30_000, 60_000, 120_000, 240_000]);
    expect(retryDelayMs(20)).toBe(3_600_000);
  });
});
