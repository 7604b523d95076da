import "server-only";
import nodemailer, { type Transporter } from "nodemailer";
import { mailConfigFrom, type MailConfig } from "./config";

let cached: { key: string; transport: Transporter } | undefined;

/** One pooled-free transport per configuration; read from the environment on every call. */
export function mailTransport(config: MailConfig = mailConfigFrom(process.env)): Transporter {
  const key = JSON.stringify([config.host, config.port, config.secure, config.auth?.user]);
  if (cached?.key === key) return cached.transport;
  const transport = nodemailer.createTransport({
    host: config.host,
    port: config.port,
    secure: config.secure,
    auth: config.auth,
    // A dead server must fail the attempt quickly so the worker can retry later.
    connectionTimeout: 10_000,
    greetingTimeout: 10_000,
    socketTimeout: 30_000,
  });
  cached = { key, transport };
  return transport;
}
