import "server-only";
// Next visit due per patient, from the latest visit's findings (lib/due-dates decides), the
// site's rule table and the clinician's own date.
import { db } from "@/db/client";
import {
  patientOverrideForUpdate, readDueInputs, setPatientOverride, setSiteRules, siteRuleRows, siteRulesForUpdate, type DueFilter,
} from "@/db/queries/due-dates";
import { recordAudit } from "@/db/queries/audit-write";
import type { SiteScope } from "@/db/queries/scope";
import { AppError } from "@/lib/errors";
import { isoDate } from "@/lib/dates/calendar";
import { nextDue, overdueDays, siteRuleTableSchema, type SiteRuleTable } from "@/lib/due-dates/rules";
import type { PatientDue } from "@/lib/due-dates/patient-due";

export type { PatientDue };
import { summariseLatestFindings } from "@/lib/due-dates/latest-findings";
import { worstHistologyByLesion } from "@/lib/tracking/histories";

export function todayIso(): string {
  return isoDate(new Date());
}

function parseRules(value: unknown): SiteRuleTable | undefined {
  const r = siteRuleTableSchema.safeParse(value ?? {});
  return r.success ? r.data : undefined;
}

/** Due dates for every patient of the filter who has at least one visit. */
export async function computeDue(filter: DueFilter, today = todayIso()): Promise<PatientDue[]> {
  const d = await readDueInputs(filter);
  const histByLesion = worstHistologyByLesion(d.histologies);
  const byPerson = new Map(d.people.map((p) => [p.patientId, p]));
  const out: PatientDue[] = [];
  for (const v of d.latest) {
    const p = byPerson.get(v.patientId)!;
    const person = {
      patientId: p.patientId, siteId: p.siteId, siteName: p.siteName, mrn: p.mrn, familyName: p.familyName, givenName: p.givenName,
      clinicianId: p.clinicianId, clinicianName: p.clinicianName, consentEmail: p.consentEmail, contactEmail: p.contactEmail,
    };
    try {
      const due = dueOf(v, p);
      out.push({ ...person, ...due, lastVisitDate: v.visitDate, overdueDays: overdueDays(due.dueDate, today) });
    } catch (err) {
      // One bad stored date (lib/dates throws RangeError) flags its row instead of failing the list.
      if (!(err instanceof RangeError)) throw err;
      out.push({ ...person, dueDate: v.visitDate, ruleKey: "clinician_override", reason: "A stored date cannot be worked with; correct the visit date.", lastVisitDate: v.visitDate, overdueDays: 0, dateProblem: true });
    }
  }
  return out;

  function dueOf(v: (typeof d.latest)[number], p: (typeof d.people)[number]) {
    const findings = summariseLatestFindings({
      visitDate: v.visitDate,
      cytology: v.cytology,
      lesions: d.lesions.filter((l) => l.visitId === v.visitId).map((l) => ({ grade: l.grade, histology: histByLesion.get(l.id) ?? null })),
      trackGrades: d.trackGrades.filter((t) => t.visitId === v.visitId).map((t) => t.grade!),
      treatments: d.treatments.filter((t) => t.patientId === v.patientId).map((t) => ({ visitDate: t.visitDate, grade: t.grade, histology: t.lesionId ? histByLesion.get(t.lesionId) ?? null : null })),
    });
    const due = nextDue({
      lastVisitDate: v.visitDate,
      findings,
      siteRules: parseRules(p.siteRules),
      clinicianOverride: p.override && p.overrideReason ? { date: p.override, reason: p.overrideReason } : undefined,
    });
    return due;
  }
}

/** One patient's due date (null when there is no visit yet). Audited by the caller's page. */
export async function getPatientDue(scope: SiteScope, patientId: string, today = todayIso()): Promise<PatientDue | null> {
  const [row] = await computeDue({ scope, patientId }, today);
  return row ?? null;
}

/** The clinician's own date with a reason, or null to return to the rules; audited with before and after. */
export async function setNextDueOverride(a: { scope: SiteScope; patientId: string; date: string | null; reason: string | null; by: string; ip: string }) {
  await db.transaction(async (tx) => {
    const p = await patientOverrideForUpdate(tx, a.scope, a.patientId);
    if (!p) throw new AppError("not_found");
    const reason = a.date ? a.reason : null;
    await setPatientOverride(tx, p.id, a.date, reason);
    await recordAudit({
      userId: a.by, siteId: p.siteId, patientId: p.id, action: a.date ? "followup.override_set" : "followup.override_cleared",
      entityType: "patient", entityId: p.id, ip: a.ip,
      detail: { before: { date: p.date, reason: p.reason }, after: { date: a.date, reason } },
    }, tx);
  });
}

export async function listSiteRules(siteIds: string[]) {
  if (siteIds.length === 0) return [];
  const rows = await siteRuleRows(siteIds);
  return rows.map((r) => ({ ...r, rules: parseRules(r.rules) ?? {} }));
}

/** Replaces a site's table; the audit event keeps the table before and after. */
export async function updateSiteRules(a: { siteId: string; rules: SiteRuleTable; by: string; ip: string }) {
  const rules = siteRuleTableSchema.parse(a.rules);
  await db.transaction(async (tx) => {
    const site = await siteRulesForUpdate(tx, a.siteId);
    if (!site) throw new AppError("not_found");
    await setSiteRules(tx, site.id, rules);
    await recordAudit({ userId: a.by, siteId: site.id, action: "followup.rules_changed", entityType: "site", entityId: site.id, ip: a.ip, detail: { before: site.rules ?? {}, after: rules } }, tx);
  });
}
