// The daily reminder job; run on demand or from a timer:
//   tsx --conditions=react-server scripts/reminders.ts
// Each responsible clinician gets one digest of their overdue patients (a count and a link, no
// names or findings); each overdue patient who agreed to e-mail gets one neutral reminder per
// due date. Idempotency keys make a second run on the same day queue nothing new.
// Reads DATABASE_URL and APP_BASE_URL; the mail worker sends what this queues.
import { inArray } from "drizzle-orm";
import { db, sql } from "@/db/client";
import { auditEvents, users } from "@/db/schema";
import { listOverdue } from "@/db/queries/worklist";
import { todayIso } from "@/db/queries/due-dates";
import { mailConfigFrom } from "@/lib/mail/config";
import { enqueueMail } from "@/lib/server/outbox";
import { clinicianDigestMail, patientReminderMail } from "@/lib/mail/templates";

export async function queueReminders(today = todayIso()) {
  const overdue = await listOverdue(today);
  const { appBaseUrl } = mailConfigFrom(process.env);
  const perClinician = new Map<string, number>();
  for (const p of overdue) if (p.clinicianId) perClinician.set(p.clinicianId, (perClinician.get(p.clinicianId) ?? 0) + 1);
  const clinicianIds = [...perClinician.keys()];
  const clinicians = clinicianIds.length
    ? await db.select({ id: users.id, email: users.email, displayName: users.displayName, active: users.active }).from(users).where(inArray(users.id, clinicianIds))
    : [];
  let digests = 0;
  let patientReminders = 0;
  await db.transaction(async (tx) => {
    for (const c of clinicians) {
      if (!c.active) continue;
      const mail = clinicianDigestMail({ displayName: c.displayName, overdueCount: perClinician.get(c.id)!, link: `${appBaseUrl}/worklist?clinician=${encodeURIComponent(c.id)}&overdue=1` });
      if (await enqueueMail(tx, { idempotencyKey: `digest:${c.id}:${today}`, to: c.email, ...mail })) digests++;
    }
    for (const p of overdue) {
      if (!p.consentEmail || !p.contactEmail) continue;
      const mail = patientReminderMail({ givenName: p.givenName });
      if (await enqueueMail(tx, { idempotencyKey: `patient-reminder:${p.patientId}:${p.dueDate}`, to: p.contactEmail, ...mail })) patientReminders++;
    }
    await tx.insert(auditEvents).values({ action: "reminders.queued", detail: { today, overdue: overdue.length, digests, patientReminders } });
  });
  return { overdue: overdue.length, digests, patientReminders };
}

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
