// What importing one row does to the patient with the same MRN at the site. Pure.
import type { ImportRowValues } from "./row-schema";
import { FIELD_LABEL, inSentence, type ImportField } from "./fields";

/** The stored patient, as far as an import reads and writes it. */
export interface StoredPatient {
  id: string;
  version: number;
  mrn: string;
  familyName: string;
  givenName: string;
  dateOfBirth: string;
  sexAtBirth: ImportRowValues["sexAtBirth"];
  postalCode: string | null;
  hivStatus: NonNullable<ImportRowValues["hivStatus"]>;
  riskGroups: NonNullable<ImportRowValues["riskGroups"]>;
  contactEmail: string | null;
}

export type PatientValues = Omit<StoredPatient, "id" | "version">;
export type Change = { before: unknown; after: unknown };

export type RowPlan =
  | { kind: "create"; values: PatientValues }
  | { kind: "update"; patient: StoredPatient; values: PatientValues; changes: Partial<Record<ImportField, Change>> }
  | { kind: "unchanged"; patient: StoredPatient }
  | { kind: "conflict"; message: string };

const UPDATABLE = ["givenName", "familyName", "sexAtBirth", "postalCode", "hivStatus", "riskGroups", "contactEmail"] as const;

const same = (a: unknown, b: unknown) => (Array.isArray(a) && Array.isArray(b) ? a.length === b.length && a.every((x, i) => x === b[i]) : a === b);
const fold = (s: string) => s.normalize("NFC").toLocaleLowerCase("en");

/**
 * A row with a new MRN creates a patient. A row with a known MRN updates that patient, but only
 * when it is the same person: the date of birth must match and the family name must match apart
 * from letter case; otherwise the row is refused (a wrong MRN would overwrite someone else).
 * An empty cell, and the value "unknown", never replace a stored value. Nothing that differs
 * means no write at all, so importing a file twice changes nothing the second time.
 */
export function planRow(stored: StoredPatient | null, row: ImportRowValues): RowPlan {
  if (!stored) {
    return {
      kind: "create",
      values: {
        mrn: row.mrn,
        familyName: row.familyName,
        givenName: row.givenName,
        dateOfBirth: row.dateOfBirth,
        sexAtBirth: row.sexAtBirth,
        postalCode: row.postalCode ?? null,
        hivStatus: row.hivStatus ?? "unknown",
        riskGroups: row.riskGroups ?? [],
        contactEmail: row.contactEmail ?? null,
      },
    };
  }
  if (stored.dateOfBirth !== row.dateOfBirth || fold(stored.familyName) !== fold(row.familyName)) {
    return {
      kind: "conflict",
      message: `MRN: ${row.mrn} already belongs to a patient at this site with another family name or date of birth. Check the MRN; to correct that patient's name or date of birth, edit the patient.`,
    };
  }
  const values: PatientValues = { ...stored };
  delete (values as Partial<StoredPatient>).id;
  delete (values as Partial<StoredPatient>).version;
  const changes: Partial<Record<ImportField, Change>> = {};
  for (const f of UPDATABLE) {
    const after = row[f];
    if (after === undefined || after === "unknown" || same(stored[f], after)) continue;
    changes[f] = { before: stored[f], after };
    (values as Record<string, unknown>)[f] = after;
  }
  return Object.keys(changes).length ? { kind: "update", patient: stored, values, changes } : { kind: "unchanged", patient: stored };
}

export const describeChanges = (changes: Partial<Record<ImportField, Change>>) =>
  Object.keys(changes).map((f) => inSentence(FIELD_LABEL[f as ImportField])).join(", ");
