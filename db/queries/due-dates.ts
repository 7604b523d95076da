import "server-only";
// Next visit due per patient, from the latest visit's findings (lib/due-dates decides), the
// site's rule table and the clinician's own date.
import { and, desc, eq, inArray, isNotNull, type SQL } from "drizzle-orm";
import { db } from "../client";
import { auditEvents, biopsies, lesions, patients, sites, trackStatuses, treatments, users, visits } from "../schema";
import { inScope, type SiteScope } from "./scope";
import { AppError } from "@/lib/errors";
import { HISTOLOGY, type Histology } from "@/lib/domain/vocab";
import { nextDue, overdueDays, siteRuleTableSchema, type NextDue, type SiteRuleTable } from "@/lib/due-dates/rules";
import { summariseLatestFindings } from "@/lib/due-dates/latest-findings";
import { isoDate } from "@/lib/dates/calendar";

export interface PatientDue extends NextDue {
  patientId: string;
  siteId: string;
  siteName: string;
  mrn: string;
  familyName: string;
  givenName: string;
  clinicianId: string | null;
  clinicianName: string | null;
  lastVisitDate: string;
  overdueDays: number;
  consentEmail: boolean;
  contactEmail: string | null;
}

const HIST_RANK = Object.fromEntries(HISTOLOGY.map((h, i) => [h, i])) as Record<Histology, number>;

export function todayIso(): string {
  return isoDate(new Date());
}

function parseRules(value: unknown): SiteRuleTable | undefined {
  const r = siteRuleTableSchema.safeParse(value ?? {});
  return r.success ? r.data : undefined;
}

/** Due dates for every patient matching `where` who has at least one visit. */
export async function computeDue(where: SQL | undefined, today = todayIso()): Promise<PatientDue[]> {
  const people = await db
    .select({
      patientId: patients.id, siteId: patients.siteId, siteName: sites.name, siteRules: sites.followupRules, mrn: patients.mrn,
      familyName: patients.familyName, givenName: patients.givenName, clinicianId: patients.clinicianId, clinicianName: users.displayName,
      override: patients.nextDueOverride, overrideReason: patients.nextDueOverrideReason, consentEmail: patients.consentEmail, contactEmail: patients.contactEmail,
    })
    .from(patients)
    .innerJoin(sites, eq(sites.id, patients.siteId))
    .leftJoin(users, eq(users.id, patients.clinicianId))
    .where(where);
  if (people.length === 0) return [];
  const ids = people.map((p) => p.patientId);
  const latest = await db
    .selectDistinctOn([visits.patientId], { patientId: visits.patientId, visitId: visits.id, visitDate: visits.visitDate, cytology: visits.cytology })
    .from(visits)
    .where(inArray(visits.patientId, ids))
    .orderBy(visits.patientId, desc(visits.visitDate), desc(visits.createdAt));
  const latestIds = latest.map((v) => v.visitId);
  if (latestIds.length === 0) return [];
  const [lesionRows, histRows, trackRows, treatmentRows] = await Promise.all([
    db.select({ id: lesions.id, visitId: lesions.visitId, grade: lesions.grade }).from(lesions).where(inArray(lesions.visitId, latestIds)),
    db.select({ lesionId: biopsies.lesionId, histology: biopsies.histology }).from(biopsies).innerJoin(visits, eq(visits.id, biopsies.visitId)).where(and(inArray(visits.patientId, ids), isNotNull(biopsies.histology))),
    db.select({ visitId: trackStatuses.visitId, grade: trackStatuses.effectiveGrade }).from(trackStatuses).where(and(inArray(trackStatuses.visitId, latestIds), isNotNull(trackStatuses.effectiveGrade))),
    db.select({ patientId: visits.patientId, visitDate: visits.visitDate, lesionId: treatments.lesionId, grade: lesions.grade })
      .from(treatments).innerJoin(visits, eq(visits.id, treatments.visitId)).leftJoin(lesions, eq(lesions.id, treatments.lesionId))
      .where(inArray(visits.patientId, ids)),
  ]);
  const histByLesion = new Map<string, Histology>();
  for (const b of histRows) {
    if (!b.lesionId || !b.histology) continue;
    const prev = histByLesion.get(b.lesionId);
    if (!prev || HIST_RANK[b.histology] > HIST_RANK[prev]) histByLesion.set(b.lesionId, b.histology);
  }
  const byPerson = new Map(people.map((p) => [p.patientId, p]));
  const out: PatientDue[] = [];
  for (const v of latest) {
    const p = byPerson.get(v.patientId)!;
    const findings = summariseLatestFindings({
      visitDate: v.visitDate,
      cytology: v.cytology,
      lesions: lesionRows.filter((l) => l.visitId === v.visitId).map((l) => ({ grade: l.grade, histology: histByLesion.get(l.id) ?? null })),
      trackGrades: trackRows.filter((t) => t.visitId === v.visitId).map((t) => t.grade!),
      treatments: treatmentRows.filter((t) => t.patientId === v.patientId).map((t) => ({ visitDate: t.visitDate, grade: t.grade, histology: t.lesionId ? histByLesion.get(t.lesionId) ?? null : null })),
    });
    const due = nextDue({
      lastVisitDate: v.visitDate,
      findings,
      siteRules: parseRules(p.siteRules),
      clinicianOverride: p.override && p.overrideReason ? { date: p.override, reason: p.overrideReason } : undefined,
    });
    out.push({
      patientId: p.patientId, siteId: p.siteId, siteName: p.siteName, mrn: p.mrn, familyName: p.familyName, givenName: p.givenName,
      clinicianId: p.clinicianId, clinicianName: p.clinicianName, consentEmail: p.consentEmail, contactEmail: p.contactEmail,
      ...due, lastVisitDate: v.visitDate, overdueDays: overdueDays(due.dueDate, today),
    });
  }
  return out;
}

/** One patient's due date (null when there is no visit yet). Audited by the caller's page. */
export async function getPatientDue(scope: SiteScope, patientId: string, today = todayIso()): Promise<PatientDue | null> {
  const [row] = await computeDue(and(eq(patients.id, patientId), inScope(patients.siteId, scope)), today);
  return row ?? null;
}

/** The clinician's own date with a reason, or null to return to the rules. */
export async function setNextDueOverride(a: { scope: SiteScope; patientId: string; date: string | null; reason: string | null; by: string; ip: string }) {
  await db.transaction(async (tx) => {
    const [p] = await tx
      .select({ id: patients.id, siteId: patients.siteId, date: patients.nextDueOverride, reason: patients.nextDueOverrideReason })
      .from(patients)
      .where(and(eq(patients.id, a.patientId), inScope(patients.siteId, a.scope)))
      .for("update")
      .limit(1);
    if (!p) throw new AppError("not_found");
    await tx.update(patients).set({ nextDueOverride: a.date, nextDueOverrideReason: a.date ? a.reason : null }).where(eq(patients.id, p.id));
    await tx.insert(auditEvents).values({
      userId: a.by, siteId: p.siteId, patientId: p.id, action: a.date ? "followup.override_set" : "followup.override_cleared",
      entityType: "patient", entityId: p.id, ip: a.ip,
      detail: { before: { date: p.date, reason: p.reason }, after: { date: a.date, reason: a.date ? a.reason : null } },
    });
  });
}

export async function listSiteRules(siteIds: string[]) {
  if (siteIds.length === 0) return [];
  const rows = await db.select({ id: sites.id, code: sites.code, name: sites.name, rules: sites.followupRules }).from(sites).where(inArray(sites.id, siteIds)).orderBy(sites.name);
  return rows.map((r) => ({ ...r, rules: parseRules(r.rules) ?? {} }));
}

/** Replaces a site's table; the audit event keeps the table before and after. */
export async function updateSiteRules(a: { siteId: string; rules: SiteRuleTable; by: string; ip: string }) {
  const rules = siteRuleTableSchema.parse(a.rules);
  await db.transaction(async (tx) => {
    const [site] = await tx.select({ id: sites.id, rules: sites.followupRules }).from(sites).where(eq(sites.id, a.siteId)).for("update").limit(1);
    if (!site) throw new AppError("not_found");
    await tx.update(sites).set({ followupRules: rules }).where(eq(sites.id, site.id));
    await tx.insert(auditEvents).values({
      userId: a.by, siteId: site.id, action: "followup.rules_changed", entityType: "site", entityId: site.id, ip: a.ip,
      detail: { before: site.rules ?? {}, after: rules },
    });
  });
}
