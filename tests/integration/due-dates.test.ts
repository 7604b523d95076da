import { describe, expect, it } from "vitest";
import { and, eq, like } from "drizzle-orm";
import { db } from "@/db/client";
import { auditEvents, lesions, mailOutbox, reviews, treatments, users, visits } from "@/db/schema";
import { getPatientDue, setNextDueOverride } from "@/lib/server/due-dates";
import { listWorklist } from "@/lib/server/worklist";
import { refreshTrackStatuses } from "@/lib/server/track-statuses";
import { notifyReviewRequested } from "@/lib/server/notifications";
import { queueReminders } from "@/scripts/reminders";
import { PUT as rulesPut } from "@/app/api/admin/followup-rules/route";
import { actor, makePatient, makeSite, makeUser, req } from "../fixtures/factory";

async function visitWith(patientId: string, siteId: string, examinerId: string, visitDate: string, grade: "hsil" | "lsil" | null, treated = false) {
  const [v] = await db.insert(visits).values({ patientId, siteId, visitDate, examinerId, status: "signed" }).returning();
  if (grade) {
    const [l] = await db.insert(lesions).values({ visitId: v!.id, siteId, label: "L1", clockStartH: 1, clockEndH: 2, distanceStartCm: 1, distanceEndCm: 2, zone: "distal_canal", grade }).returning();
    if (treated) await db.insert(treatments).values({ visitId: v!.id, siteId, lesionId: l!.id, modality: "electrocautery" });
  }
  await refreshTrackStatuses(db, patientId, siteId);
  return v!;
}

describe("next visit due", () => {
  it("follows the rule of the latest findings, then the site's table, then the clinician's date (each audited)", async () => {
    const site = await makeSite();
    const clin = await actor("clinician", [site.id]);
    const admin = await actor("admin", [site.id]);
    const scope = { userId: clin.userId, siteIds: [site.id] };
    const p = await makePatient(site.id, { clinicianId: clin.userId });
    await visitWith(p.id, site.id, clin.userId, "2025-01-15", "hsil", true);
    // HSIL treated: 3 months (Goldstone 2005, 3-6 months after treatment; lower bound is our default).
    expect((await getPatientDue(scope, p.id, "2025-02-01"))!.dueDate).toBe("2025-04-15");

    const res = await rulesPut(req("PUT", "/api/admin/followup-rules", admin, { siteId: site.id, rules: { after_hsil_treatment: 6 } }));
    expect(res.status).toBe(200);
    expect((await getPatientDue(scope, p.id, "2025-02-01"))!.dueDate).toBe("2025-07-15");
    const [change] = await db.select().from(auditEvents).where(and(eq(auditEvents.entityId, site.id), eq(auditEvents.action, "followup.rules_changed")));
    expect(change!.detail).toEqual({ before: {}, after: { after_hsil_treatment: 6 } });

    // Out of range is refused and nothing changes (1-36 months).
    const refused = await rulesPut(req("PUT", "/api/admin/followup-rules", admin, { siteId: site.id, rules: { clear_exam: 0 } }));
    expect(refused.status).toBe(400);
    // In plain words, not the validation library's ("Too small: expected number to be >=1").
    expect((await refused.json()).error.fields["rules.clear_exam"]).toEqual(["Enter a number of at least 1."]);

    await setNextDueOverride({ scope, patientId: p.id, date: "2025-03-01", reason: "Patient travelling in summer", by: clin.userId, ip: "t" });
    const due = (await getPatientDue(scope, p.id, "2025-03-11"))!;
    expect(due).toMatchObject({ dueDate: "2025-03-01", ruleKey: "clinician_override", overdueDays: 10 });
    const [ov] = await db.select().from(auditEvents).where(and(eq(auditEvents.patientId, p.id), eq(auditEvents.action, "followup.override_set")));
    expect(ov!.detail).toMatchObject({ after: { date: "2025-03-01", reason: "Patient travelling in summer" } });
  });

  it("the latest visit decides: an LSIL-only follow-up a year after treatment waits 12 months (yearly LSIL review, from memory)", async () => {
    const site = await makeSite();
    const clin = await makeUser("clinician", [site.id]);
    const p = await makePatient(site.id, { clinicianId: clin });
    await visitWith(p.id, site.id, clin, "2023-01-10", "hsil", true);
    await visitWith(p.id, site.id, clin, "2024-06-10", "lsil");
    const due = (await getPatientDue({ userId: clin, siteIds: [site.id] }, p.id, "2024-07-01"))!;
    expect(due.ruleKey).toBe("lsil_only");
    expect(due.dueDate).toBe("2025-06-10");
  });

  it("another site's patient has no due date for the caller", async () => {
    const site = await makeSite();
    const clin = await makeUser("clinician", [site.id]);
    const p = await makePatient(site.id);
    await visitWith(p.id, site.id, clin, "2024-01-10", null);
    expect(await getPatientDue({ userId: "x", siteIds: [(await makeSite()).id] }, p.id)).toBeNull();
  });
});

describe("worklist", () => {
  it("filters by clinician and overdue days, sorts, and stays within the caller's sites", async () => {
    const site = await makeSite();
    const a = await makeUser("clinician", [site.id]);
    const b = await makeUser("clinician", [site.id]);
    const p1 = await makePatient(site.id, { clinicianId: a, familyName: "Aardvark" });
    const p2 = await makePatient(site.id, { clinicianId: b, familyName: "Zebra" });
    await visitWith(p1.id, site.id, a, "2024-01-10", null); // clear exam: due 2025-01-10
    await visitWith(p2.id, site.id, b, "2024-06-10", "hsil"); // untreated HSIL: due 2024-09-10
    const scope = { userId: a, siteIds: [site.id] };
    const today = "2025-03-01";
    const all = await listWorklist(scope, { minOverdueDays: 1 }, today);
    expect(all.rows.map((r) => r.familyName)).toEqual(["Zebra", "Aardvark"]);
    // 2024-09-10 to 2025-03-01 is 172 days; 2025-01-10 to 2025-03-01 is 50 days.
    expect(all.rows.map((r) => r.overdueDays)).toEqual([172, 50]);
    expect((await listWorklist(scope, { minOverdueDays: 100 }, today)).rows.map((r) => r.familyName)).toEqual(["Zebra"]);
    expect((await listWorklist(scope, { clinicianId: a, minOverdueDays: 1 }, today)).rows.map((r) => r.familyName)).toEqual(["Aardvark"]);
    expect((await listWorklist(scope, { sort: "name", dir: "asc", minOverdueDays: 1 }, today)).rows.map((r) => r.familyName)).toEqual(["Aardvark", "Zebra"]);
    expect((await listWorklist({ userId: a, siteIds: [(await makeSite()).id] }, {}, today)).total).toBe(0);
  });
});

describe("reminders and review mail", () => {
  it("queues one digest per clinician and one neutral reminder per consenting patient; a second run queues nothing", async () => {
    const site = await makeSite();
    const clin = await makeUser("clinician", [site.id]);
    const yes = await makePatient(site.id, { clinicianId: clin, consentEmail: true, contactEmail: `yes-${site.code}@mail.example` });
    const no = await makePatient(site.id, { clinicianId: clin, consentEmail: false, contactEmail: `no-${site.code}@mail.example` });
    await visitWith(yes.id, site.id, clin, "2020-01-10", null);
    await visitWith(no.id, site.id, clin, "2020-01-10", null);
    await queueReminders("2025-03-01");
    await queueReminders("2025-03-01");
    const digest = await db.select().from(mailOutbox).where(eq(mailOutbox.idempotencyKey, `digest:${clin}:2025-03-01`));
    expect(digest).toHaveLength(1);
    expect(digest[0]!.textBody).toContain("2 patients");
    expect(digest[0]!.textBody).not.toMatch(/Testperson|MRN|hsil/i);
    expect(await db.select().from(mailOutbox).where(like(mailOutbox.idempotencyKey, `patient-reminder:${yes.id}:%`))).toHaveLength(1);
    expect(await db.select().from(mailOutbox).where(like(mailOutbox.idempotencyKey, `patient-reminder:${no.id}:%`))).toHaveLength(0);
  });

  it("a requested review queues one mail to the reviewer", async () => {
    const site = await makeSite();
    const clin = await makeUser("clinician", [site.id]);
    const reviewer = await makeUser("reviewer", [site.id]);
    const p = await makePatient(site.id);
    const v = await visitWith(p.id, site.id, clin, "2025-01-10", null);
    const [r] = await db.insert(reviews).values({ patientId: p.id, siteId: site.id, visitId: v.id, reviewerId: reviewer, requestedBy: clin }).returning();
    expect(await db.transaction((tx) => notifyReviewRequested(tx, r!.id))).toBe(true);
    expect(await db.transaction((tx) => notifyReviewRequested(tx, r!.id))).toBe(false);
    const [mail] = await db.select().from(mailOutbox).where(eq(mailOutbox.idempotencyKey, `review-requested:${r!.id}`));
    const [rev] = await db.select({ email: users.email }).from(users).where(eq(users.id, reviewer));
    expect(mail!.toAddress).toBe(rev!.email);
  });
});
