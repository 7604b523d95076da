// Mail settings from the environment. A deployment sets these and nothing else changes:
//   SMTP_HOST (default 127.0.0.1), SMTP_PORT (default 1025), SMTP_SECURE ("true" = TLS from the
//   first byte, usually port 465; otherwise STARTTLS when the server offers it), SMTP_USER and
//   SMTP_PASS (both or neither), MAIL_FROM (the sender), APP_BASE_URL (where links in mails point).
import { createHash } from "node:crypto";

export interface MailConfig {
  host: string;
  port: number;
  secure: boolean;
  auth?: { user: string; pass: string };
  from: string;
  appBaseUrl: string;
}

type Env = Record<string, string | undefined>;

export function mailConfigFrom(env: Env): MailConfig {
  const port = Number(env.SMTP_PORT ?? 1025);
  if (!Number.isInteger(port) || port < 1 || port > 65535) throw new Error(`SMTP_PORT is not a port number: ${env.SMTP_PORT}`);
  const user = env.SMTP_USER?.trim();
  const pass = env.SMTP_PASS;
  if (Boolean(user) !== Boolean(pass)) throw new Error("Set both SMTP_USER and SMTP_PASS, or neither");
  return {
    host: env.SMTP_HOST?.trim() || "127.0.0.1",
    port,
    secure: env.SMTP_SECURE === "true" || env.SMTP_SECURE === "1",
    auth: user && pass ? { user, pass } : undefined,
    from: env.MAIL_FROM?.trim() || "Dentate <no-reply@dentate.invalid>",
    appBaseUrl: (env.APP_BASE_URL?.trim() || "http://127.0.0.1:3000").replace(/\/+$/, ""),
  };
}

/** The domain part of the sender, for Message-IDs. */
export function senderDomain(from: string): string {
  const m = /@([A-Za-z0-9.-]+)>?\s*$/.exec(from);
  return m?.[1] ?? "dentate.invalid";
}

/**
 * The same idempotency key always gives the same Message-ID, so a message sent twice after a
 * crash is recognisable as one message by any receiving system that de-duplicates on it.
 */
export function messageIdFor(idempotencyKey: string, domain: string): string {
  const digest = createHash("sha256").update(idempotencyKey, "utf8").digest("hex").slice(0, 32);
  return `<${digest}@${domain}>`;
}

/** After the n-th failed attempt: 30 s doubling to at most an hour. */
export function retryDelayMs(failedAttempts: number): number {
  const n = Math.max(1, failedAttempts);
  return Math.min(30_000 * 2 ** (n - 1), 60 * 60 * 1000);
}

/** After this many failures a message stops being retried and shows as failed. */
export const MAX_MAIL_ATTEMPTS = 12;
