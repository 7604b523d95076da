// The daily reminder job; run on demand or from a timer:
//   tsx --conditions=react-server scripts/reminders.ts
// Each responsible clinician gets one digest of their overdue patients (a count and a link, no
// names or findings); each overdue patient who agreed to e-mail gets one neutral reminder per
// due date. Idempotency keys make a second run on the same day queue nothing new.
// Reads DATABASE_URL and APP_BASE_URL; the mail worker sends what this queues.
import { sql } from "@/db/client";
import { queueReminders } from "@/lib/server/reminders";

export { queueReminders };

const isMain = process.argv[1] && /reminders\.ts$/.test(process.argv[1]);
if (isMain) {
  queueReminders()
    .then((r) => console.log(`[reminders] ${r.overdue} overdue; queued ${r.digests} clinician digests and ${r.patientReminders} patient reminders`))
    .then(() => sql.end())
    .catch(async (err) => {
      console.error("[reminders] failed", err);
      await sql.end();
      process.exit(1);
    });
}
