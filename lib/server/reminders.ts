import "server-only";
import { db } from "@/db/client";
import { usersForMail } from "@/db/queries/worklist";
import { recordAudit } from "@/db/queries/audit-write";
import { mailConfigFrom } from "@/lib/mail/config";
import { clinicianDigestMail, patientReminderMail } from "@/lib/mail/templates";
import { todayIso } from "./due-dates";
import { enqueueMail } from "./outbox";
import { listOverdue } from "./worklist";

/**
 * The daily reminders: a digest to each responsible clinician with overdue patients, and a
 * reminder to each overdue patient who agreed to e-mail. Each is queued once per day (key).
 */
export async function queueReminders(today = todayIso()) {
  const overdue = await listOverdue(today);
  const { appBaseUrl } = mailConfigFrom(process.env);
  const perClinician = new Map<string, number>();
  for (const p of overdue) if (p.clinicianId) perClinician.set(p.clinicianId, (perClinician.get(p.clinicianId) ?? 0) + 1);
  const clinicians = await usersForMail([...perClinician.keys()]);
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
      const mail = patientReminderMail({ givenName: p.givenName, clinicName: p.siteName });
      if (await enqueueMail(tx, { idempotencyKey: `patient-reminder:${p.patientId}:${p.dueDate}`, to: p.contactEmail, ...mail })) patientReminders++;
    }
    await recordAudit({ action: "reminders.queued", detail: { today, overdue: overdue.length, digests, patientReminders } }, tx);
  });
  return { overdue: overdue.length, digests, patientReminders };
}
