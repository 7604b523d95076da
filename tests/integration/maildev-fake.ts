// A private maildev for one test file: its own ports and mail directory, stopped and restarted
// at will. The app code reads SMTP_* from process.env, which start() sets.
import { spawn, type ChildProcess } from "node:child_process";
import { mkdtempSync } from "node:fs";
import net from "node:net";
import { tmpdir } from "node:os";
import path from "node:path";

const BIN = path.resolve(__dirname, "../../node_modules/.bin/maildev");

export interface InboxMail {
  id: string;
  subject: string;
  text: string;
  to: { address: string }[];
  headers: Record<string, string>;
}

async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = net.createServer();
    s.listen(0, "127.0.0.1", () => {
      const port = (s.address() as net.AddressInfo).port;
      s.close(() => resolve(port));
    });
    s.on("error", reject);
  });
}

export class MaildevFake {
  smtpPort = 0;
  webPort = 0;
  private child: ChildProcess | null = null;
  private readonly dir = mkdtempSync(path.join(tmpdir(), "dentate-maildev-"));

  get webUrl() {
    return `http://127.0.0.1:${this.webPort}`;
  }

  async start(): Promise<void> {
    if (!this.smtpPort) [this.smtpPort, this.webPort] = [await freePort(), await freePort()];
    this.child = spawn(BIN, ["--smtp", String(this.smtpPort), "--web", String(this.webPort), "--ip", "127.0.0.1", "--web-ip", "127.0.0.1", "--mail-directory", this.dir, "--silent"], { stdio: "ignore" });
    Object.assign(process.env, { SMTP_HOST: "127.0.0.1", SMTP_PORT: String(this.smtpPort), SMTP_SECURE: "false", MAIL_FROM: "Dentate <no-reply@dentate.example>", APP_BASE_URL: "http://dentate.test" });
    const end = Date.now() + 20_000;
    while (Date.now() < end) {
      const up = await fetch(`${this.webUrl}/api/email`).then((r) => r.ok).catch(() => false);
      if (up && (await this.smtpAnswers())) return;
      await new Promise((r) => setTimeout(r, 150));
    }
    throw new Error("maildev did not start");
  }

  async stop(): Promise<void> {
    const child = this.child;
    this.child = null;
    if (!child || child.exitCode !== null) return;
    await new Promise<void>((resolve) => {
      child.once("exit", () => resolve());
      child.kill("SIGKILL");
    });
  }

  private smtpAnswers(): Promise<boolean> {
    return new Promise((resolve) => {
      const s = net.connect(this.smtpPort, "127.0.0.1", () => { s.destroy(); resolve(true); });
      s.on("error", () => resolve(false));
    });
  }

  async inbox(): Promise<InboxMail[]> {
    return (await (await fetch(`${this.webUrl}/api/email`)).json()) as InboxMail[];
  }

  async mailsTo(address: string): Promise<InboxMail[]> {
    return (await this.inbox()).filter((m) => m.to.some((t) => t.address.toLowerCase() === address.toLowerCase()));
  }
}

/** The link in a mail body that starts with the given path. */
export function linkIn(text: string, pathPrefix: string): string {
  const m = new RegExp(`https?://\\S+${pathPrefix.replace(/\//g, "\\/")}\\S+`).exec(text);
  if (!m) throw new Error(`no ${pathPrefix} link in: ${text}`);
  return m[0];
}
