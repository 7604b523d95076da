import "server-only";
// The file of an import read into a table: its size checked, CSV parsed, or a FHIR Bundle
// validated against the R4 definitions and read. A file that cannot be read at all is refused
// here (400 or 413, with the reason); row-level problems are left to the row checks.
import { AppError } from "@/lib/errors";
import { errorsOf, loadFhirValidator } from "@/lib/server/fhir-validator";
import type { SourceTable } from "@/lib/patient-import/csv";
import { readCsv } from "@/lib/patient-import/csv";
import { readPatientBundle } from "@/lib/patient-import/fhir";
import { guessMapping, mappingProblems, type ColumnMapping } from "@/lib/patient-import/fields";
import { MAX_FILE_BYTES, megabytes } from "@/lib/patient-import/limits";
import type { RowProblem } from "@/lib/patient-import/rows";
import type { ImportCheckInput } from "@/lib/validation/patient-import";

export interface ImportFile {
  table: SourceTable;
  mapping: ColumnMapping;
  mappingProblems: string[];
  /** Problems found while reading (a bundle entry that is not a Patient). */
  problems: RowProblem[];
  notes: string[];
}

const MAX_VALIDATOR_LINES = 50;

export async function readImportFile(input: ImportCheckInput): Promise<ImportFile> {
  const bytes = Buffer.byteLength(input.content, "utf8");
  if (bytes > MAX_FILE_BYTES) {
    throw new AppError("too_large", `The file is ${megabytes(bytes)}; at most ${megabytes(MAX_FILE_BYTES)} can be imported at once. Split it into smaller files.`);
  }
  if (input.format === "csv") {
    const read = readCsv(input.content);
    if (!read.ok) throw new AppError("invalid", read.message, { file: [read.message] });
    const mapping = input.mapping ?? guessMapping(read.table.headers);
    return { table: read.table, mapping, mappingProblems: mappingProblems(mapping, read.table.headers.length), problems: [], notes: [] };
  }
  let bundle: unknown;
  try {
    bundle = JSON.parse(input.content);
  } catch {
    throw new AppError("invalid", "The file is not JSON, so it cannot be a FHIR bundle.", { file: ["Not JSON."] });
  }
  await loadFhirValidator();
  const errors = errorsOf(bundle);
  if (errors.length) {
    const shown = errors.slice(0, MAX_VALIDATOR_LINES);
    if (errors.length > shown.length) shown.push(`… and ${errors.length - shown.length} more`);
    throw new AppError("invalid", "The bundle does not pass FHIR R4 validation, so nothing was read from it.", { file: shown });
  }
  const read = readPatientBundle(bundle);
  if (!read.ok) throw new AppError("invalid", read.message, { file: [read.message] });
  return {
    table: read.table,
    mapping: read.mapping,
    mappingProblems: [],
    problems: read.problems,
    notes: [
      "Sex at birth is read from the US Core birth-sex extension; a Patient without it is imported as unknown (FHIR's gender is not sex at birth).",
      "HIV status and risk groups are not part of a FHIR Patient: record them on the patient's page.",
    ],
  };
}
