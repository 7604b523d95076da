// A FHIR R4 Bundle of Patient resources read as a table, one record per Patient entry, so it is
// checked by the same rules as a CSV file. Pure; validation against the R4 definitions is done
// before this (lib/server/fhir-validator.ts).
import type { SourceTable } from "./csv";
import { IMPORT_FIELDS, type ColumnMapping, type ImportField } from "./fields";
import { MAX_ROWS } from "./limits";
import type { RowProblem } from "./rows";

type Json = Record<string, unknown>;
const obj = (v: unknown): Json | null => (v && typeof v === "object" && !Array.isArray(v) ? (v as Json) : null);
const arr = (v: unknown): Json[] => (Array.isArray(v) ? v.map(obj).filter((x): x is Json => x !== null) : []);
const str = (v: unknown) => (typeof v === "string" ? v : "");

// US Core birth sex (http://hl7.org/fhir/us/core/StructureDefinition/us-core-birthsex), codes
// F, M, UNK. Patient.gender is administrative gender, not sex at birth, so it is not used: a
// Patient without the extension is imported with sex at birth unknown.
export const BIRTH_SEX_URL = "http://hl7.org/fhir/us/core/StructureDefinition/us-core-birthsex";
const BIRTH_SEX: Record<string, string> = { F: "female", M: "male", UNK: "unknown" };

function cellsOf(p: Json): Record<ImportField, string> {
  const ids = arr(p.identifier);
  const mr = ids.find((i) => arr(obj(i.type)?.coding).some((c) => str(c.code) === "MR")) ?? ids[0];
  const names = arr(p.name);
  const name = names.find((n) => n.use === "official") ?? names[0];
  const addresses = arr(p.address);
  const address = addresses.find((a) => a.use === "home") ?? addresses[0];
  const email = arr(p.telecom).find((t) => t.system === "email");
  const birthSex = arr(p.extension).find((e) => e.url === BIRTH_SEX_URL);
  return {
    mrn: str(mr?.value),
    familyName: str(name?.family),
    givenName: (Array.isArray(name?.given) ? name.given : []).filter((g) => typeof g === "string").join(" "),
    dateOfBirth: str(p.birthDate),
    sexAtBirth: BIRTH_SEX[str(birthSex?.valueCode)] ?? "unknown",
    postalCode: str(address?.postalCode),
    hivStatus: "",
    riskGroups: "",
    contactEmail: str(email?.value),
  };
}

export type BundleRead = { ok: true; table: SourceTable; mapping: ColumnMapping; problems: RowProblem[] } | { ok: false; message: string };

/** The Patient entries of a Bundle (entry numbers count from 1); other resources are reported. */
export function readPatientBundle(bundle: unknown): BundleRead {
  const b = obj(bundle);
  if (!b || b.resourceType !== "Bundle") return { ok: false, message: "The file is JSON but not a FHIR Bundle (resourceType must be \"Bundle\")." };
  const entries = Array.isArray(b.entry) ? b.entry : [];
  if (entries.length === 0) return { ok: false, message: "The bundle has no entries." };
  if (entries.length > MAX_ROWS) return { ok: false, message: `The bundle has ${entries.length.toLocaleString("en")} entries; at most ${MAX_ROWS.toLocaleString("en")} are imported at once. Split it.` };
  const problems: RowProblem[] = [];
  const records = [];
  for (const [i, e] of entries.entries()) {
    const resource = obj(obj(e)?.resource);
    if (resource?.resourceType !== "Patient") {
      problems.push({ line: i + 1, field: null, message: `A ${str(resource?.resourceType) || "missing resource"}, not a Patient: not imported.` });
      continue;
    }
    const cells = cellsOf(resource);
    records.push({ line: i + 1, cells: IMPORT_FIELDS.map((f) => cells[f.key]) });
  }
  const mapping = Object.fromEntries(IMPORT_FIELDS.map((f, i) => [f.key, i])) as ColumnMapping;
  return { ok: true, table: { headers: IMPORT_FIELDS.map((f) => f.label), records }, mapping, problems };
}
