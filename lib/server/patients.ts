import "server-only";
// Registering a patient and correcting their details. The same MRN at a site is refused (the existing
// record named); the same date of birth with the same or a close family name is a warning the user
// confirms. Edits carry the version they were read at; every change is audited with before and after.
import { db } from "@/db/client";
import {
  insertPatient, isClinicianAtSite, patientByMrn, patientForUpdate, similarPatients, updatePatientRow,
  type EditablePatient, type PatientValues,
} from "@/db/queries/patients";
import type { SiteScope } from "@/db/queries/scope";
import { recordAudit } from "@/db/queries/audit-write";
import { AppError } from "@/lib/errors";
import type { PatientFields, RegisterPatientInput, UpdatePatientInput } from "@/lib/validation/patients";

interface Actor {
  id: string;
  siteIds: string[];
}

export interface DuplicateCandidate {
  id: string;
  mrn: string;
  familyName: string;
  givenName: string;
  dateOfBirth: string;
}

export type RegisterResult =
  | { kind: "created"; patient: EditablePatient }
  | { kind: "mrn_taken"; existing: { id: string; familyName: string; givenName: string } }
  | { kind: "possible_duplicate"; candidates: DuplicateCandidate[] };

const CLINICIAN_FIELD = { clinicianId: ["Choose a clinician or administrator who works at this site."] };

function toValues(f: Partial<PatientFields>): Partial<PatientValues> {
  const { postalCode, ...rest } = f;
  return postalCode === undefined ? rest : { ...rest, zip: postalCode };
}

// A unique-constraint violation (SQLSTATE 23505) on the site + MRN pair: a registration that raced ours.
function isMrnRace(err: unknown): boolean {
  const e = err as { code?: string; constraint_name?: string; cause?: unknown } | null;
  if (!e || typeof e !== "object") return false;
  if (e.code === "23505" && e.constraint_name === "patients_site_mrn") return true;
  return isMrnRace(e.cause);
}

export async function registerPatient(actor: Actor, input: RegisterPatientInput, ip: string): Promise<RegisterResult> {
  if (!actor.siteIds.includes(input.siteId)) throw new AppError("invalid", undefined, { siteId: ["You can register patients only at a site you work at."] });
  const { siteId, confirmDuplicate, ...fields } = input;
  try {
    return await db.transaction(async (tx) => {
      const existing = await patientByMrn(tx, siteId, fields.mrn);
      if (existing) return { kind: "mrn_taken", existing } as const;
      if (fields.clinicianId && !(await isClinicianAtSite(tx, fields.clinicianId, siteId))) throw new AppError("invalid", undefined, CLINICIAN_FIELD);
      if (!confirmDuplicate) {
        const candidates = await similarPatients(tx, siteId, fields.familyName, fields.dateOfBirth);
        if (candidates.length) return { kind: "possible_duplicate", candidates: candidates.map((c) => ({ id: c.id, mrn: c.mrn, familyName: c.familyName, givenName: c.givenName, dateOfBirth: c.dateOfBirth })) } as const;
      }
      const patient = await insertPatient(tx, { siteId, ...(toValues(fields) as Omit<PatientValues, "siteId">) });
      await recordAudit(
        { userId: actor.id, siteId, patientId: patient.id, action: "patient.create", entityType: "patient", entityId: patient.id, ip, detail: { after: patient, confirmedDuplicate: confirmDuplicate === true } },
        tx,
      );
      return { kind: "created", patient } as const;
    });
  } catch (err) {
    if (!isMrnRace(err)) throw err;
    const existing = await db.transaction((tx) => patientByMrn(tx, siteId, fields.mrn));
    if (!existing) throw err;
    return { kind: "mrn_taken", existing };
  }
}

/** Only what changed, field by field, for the audit row. */
function changed(before: EditablePatient, after: EditablePatient) {
  const b: Record<string, unknown> = {};
  const a: Record<string, unknown> = {};
  for (const k of Object.keys(after) as (keyof EditablePatient)[]) {
    if (k === "version") continue;
    if (JSON.stringify(before[k]) !== JSON.stringify(after[k])) {
      b[k] = before[k];
      a[k] = after[k];
    }
  }
  return { before: b, after: a };
}

export async function updatePatient(actor: Actor, scope: SiteScope, patientId: string, input: UpdatePatientInput, ip: string) {
  return db.transaction(async (tx) => {
    const before = await patientForUpdate(tx, scope, patientId);
    if (!before) throw new AppError("not_found");
    if (before.version !== input.version) throw new AppError("conflict", "Someone changed this patient's details meanwhile: reload to see their change.");
    const { version, ...fields } = input;
    if (fields.mrn && fields.mrn !== before.mrn) {
      const holder = await patientByMrn(tx, before.siteId, fields.mrn, patientId);
      if (holder) throw new AppError("conflict", "Another patient at this site has this record number.", { mrn: [`Already used by ${holder.familyName}, ${holder.givenName}.`] });
    }
    if (fields.clinicianId && fields.clinicianId !== before.clinicianId && !(await isClinicianAtSite(tx, fields.clinicianId, before.siteId))) {
      throw new AppError("invalid", undefined, CLINICIAN_FIELD);
    }
    const after = await updatePatientRow(tx, patientId, toValues(fields), version + 1);
    const diff = changed(before, after);
    await recordAudit(
      { userId: actor.id, siteId: before.siteId, patientId, action: "patient.update", entityType: "patient", entityId: patientId, ip, detail: { ...diff, version: after.version } },
      tx,
    );
    return after;
  });
}
