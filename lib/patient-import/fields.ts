// The patient fields a file can fill, and how a column header is matched to one. Pure.

export const IMPORT_FIELDS = [
  { key: "mrn", label: "MRN", required: true, headers: ["mrn", "medical record number", "record number", "hospital number", "patient number"] },
  { key: "familyName", label: "Family name", required: true, headers: ["family name", "surname", "last name", "family"] },
  { key: "givenName", label: "Given names", required: true, headers: ["given name", "given names", "first name", "forename", "given"] },
  { key: "dateOfBirth", label: "Date of birth", required: true, headers: ["date of birth", "dob", "birth date", "birthdate", "born"] },
  { key: "sexAtBirth", label: "Sex at birth", required: true, headers: ["sex at birth", "sex", "birth sex"] },
  { key: "postalCode", label: "Postal code", required: false, headers: ["postal code", "postcode", "zip", "zip code"] },
  { key: "hivStatus", label: "HIV status", required: false, headers: ["hiv status", "hiv"] },
  { key: "riskGroups", label: "Risk groups", required: false, headers: ["risk groups", "risk group", "risk"] },
  { key: "contactEmail", label: "Contact e-mail", required: false, headers: ["contact e-mail", "contact email", "e-mail", "email"] },
] as const;

export type ImportField = (typeof IMPORT_FIELDS)[number]["key"];
export const IMPORT_FIELD_KEYS = IMPORT_FIELDS.map((f) => f.key) as [ImportField, ...ImportField[]];
export const FIELD_LABEL = Object.fromEntries(IMPORT_FIELDS.map((f) => [f.key, f.label])) as Record<ImportField, string>;

/** For each field, the index of the column it is read from, or null when no column fills it. */
export type ColumnMapping = Record<ImportField, number | null>;

/** A label inside a sentence: "family name", but "MRN" and "HIV status" keep their capitals. */
export const inSentence = (label: string) => (/^[A-Z]{2}/.test(label) ? label : label.toLowerCase());

const normal = (s: string) => s.toLowerCase().replace(/[^a-z0-9]/g, "");

/**
 * The mapping guessed from the header row: a header names a field when it equals one of the
 * field's usual headers once case, spaces and punctuation are set aside. Each column fills at
 * most one field, the first that claims it.
 */
export function guessMapping(headers: readonly string[]): ColumnMapping {
  const taken = new Set<number>();
  const mapping = {} as ColumnMapping;
  for (const f of IMPORT_FIELDS) {
    const names = new Set<string>(f.headers.map(normal));
    const index = headers.findIndex((h, i) => !taken.has(i) && names.has(normal(h)));
    mapping[f.key] = index >= 0 ? index : null;
    if (index >= 0) taken.add(index);
  }
  return mapping;
}

/** A column chosen for a field (or for none) takes it from whichever field had it; the field's old column is freed. */
export function assignColumn(mapping: ColumnMapping, column: number, field: ImportField | null): ColumnMapping {
  const next = { ...mapping };
  for (const f of IMPORT_FIELDS) if (next[f.key] === column) next[f.key] = null;
  if (field) next[field] = column;
  return next;
}

/** What is wrong with a mapping as a whole (a required field without a column, a column used twice). */
export function mappingProblems(mapping: ColumnMapping, columnCount: number): string[] {
  const problems: string[] = [];
  const used = new Map<number, ImportField>();
  for (const f of IMPORT_FIELDS) {
    const index = mapping[f.key];
    if (index === null) {
      if (f.required) problems.push(`Choose the column that holds ${inSentence(f.label)}.`);
      continue;
    }
    if (index >= columnCount) problems.push(`${f.label}: the file has no column ${index + 1}.`);
    const other = used.get(index);
    if (other) problems.push(`Column ${index + 1} is chosen for both ${inSentence(FIELD_LABEL[other])} and ${inSentence(f.label)}.`);
    used.set(index, f.key);
  }
  return problems;
}
