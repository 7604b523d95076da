// Sends queued mail on an interval (scripts/start.sh starts it):
//   tsx --conditions=react-server scripts/mail-worker.ts
// Reads DATABASE_URL, SMTP_HOST, SMTP_PORT, SMTP_SECURE, SMTP_USER, SMTP_PASS, MAIL_FROM and
// MAIL_WORKER_INTERVAL_MS (default 5000). Stops cleanly on SIGINT/SIGTERM after the current row.
import { sql } from "@/db/client";
import { deliverPending } from "@/lib/server/outbox";

const intervalMs = Number(process.env.MAIL_WORKER_INTERVAL_MS ?? 5000);
let stopping = false;
let wake: (() => void) | undefined;

for (const signal of ["SIGINT", "SIGTERM"] as const) {
  process.on(signal, () => {
    stopping = true;
    wake?.();
  });
}

async function main() {
  console.log(`[mail-worker] sending every ${intervalMs} ms`);
  while (!stopping) {
    try {
      const r = await deliverPending();
      if (r.sent || r.retrying || r.failed) console.log(`[mail-worker] sent ${r.sent}, will retry ${r.retrying}, gave up ${r.failed}`);
    } catch (err) {
      // The database may be briefly away; the next round tries again.
      console.error("[mail-worker] round failed:", (err as Error).message);
    }
    await new Promise<void>((resolve) => {
      wake = resolve;
      setTimeout(resolve, intervalMs);
    });
  }
  await sql.end();
}

void main();
