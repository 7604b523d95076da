// Checking every record of a file against the field rules, with each problem tied to its line. Pure.
import type { SourceTable } from "./csv";
import { formulaProblem, readHivStatus, readRiskGroups, readSexAtBirth, readText } from "./cells";
import { FIELD_LABEL, IMPORT_FIELDS, type ColumnMapping, type ImportField } from "./fields";
import { MAX_CELL_CHARS } from "./limits";
import { importRowSchema, type ImportRowValues } from "./row-schema";

export interface RowProblem {
  line: number;
  field: ImportField | null;
  message: string;
}

export interface ImportRow {
  line: number;
  values: ImportRowValues;
}

export interface RowCheck {
  rows: ImportRow[];
  problems: RowProblem[];
  /** Lines with at least one problem. */
  badLines: number[];
}

const READERS: Record<ImportField, (raw: string) => { value: unknown } | { error: string }> = {
  mrn: readText,
  familyName: readText,
  givenName: readText,
  dateOfBirth: readText,
  sexAtBirth: readSexAtBirth,
  postalCode: readText,
  hivStatus: readHivStatus,
  riskGroups: readRiskGroups,
  contactEmail: readText,
};

/** Checks each record alone, then the MRNs across the file (one row per MRN). */
export function checkRows(table: SourceTable, mapping: ColumnMapping, unit: "line" | "entry" = "line"): RowCheck {
  const problems: RowProblem[] = [];
  const good: ImportRow[] = [];
  // Every line that names an MRN, good or not: a repeated MRN makes all its rows doubtful.
  const linesOfMrn = new Map<string, number[]>();
  for (const { line, cells } of table.records) {
    const own: RowProblem[] = [];
    cells.forEach((cell, i) => {
      if (cell.length > MAX_CELL_CHARS) {
        const field = IMPORT_FIELDS.find((f) => mapping[f.key] === i)?.key ?? null;
        own.push({ line, field, message: `Column ${i + 1} (${table.headers[i] || "no header"}) holds ${cell.length.toLocaleString("en")} characters; a cell may hold at most ${MAX_CELL_CHARS.toLocaleString("en")}.` });
      }
    });
    const input: Record<string, unknown> = {};
    for (const f of IMPORT_FIELDS) {
      const index = mapping[f.key];
      const raw = index === null ? "" : (cells[index] ?? "");
      if (raw.length > MAX_CELL_CHARS) continue;
      const formula = formulaProblem(raw);
      if (formula) {
        own.push({ line, field: f.key, message: `${f.label}: ${formula}` });
        continue;
      }
      const read = READERS[f.key](raw);
      if ("error" in read) own.push({ line, field: f.key, message: `${f.label}: ${read.error}` });
      else input[f.key] = read.value;
    }
    if (typeof input.mrn === "string") linesOfMrn.set(input.mrn, [...(linesOfMrn.get(input.mrn) ?? []), line]);
    const parsed = importRowSchema.safeParse(input);
    if (!parsed.success) {
      for (const issue of parsed.error.issues) {
        const field = issue.path[0] as ImportField | undefined;
        if (field && own.some((p) => p.field === field)) continue;
        own.push({ line, field: field ?? null, message: field ? `${FIELD_LABEL[field]}: ${issue.message}` : issue.message });
      }
    }
    if (own.length) problems.push(...own);
    else if (parsed.success) good.push({ line, values: parsed.data });
  }
  const repeated = new Set<number>();
  for (const [mrn, lines] of linesOfMrn) {
    if (lines.length < 2) continue;
    for (const line of lines) {
      repeated.add(line);
      problems.push({ line, field: "mrn", message: `MRN: ${mrn} appears on ${unit}s ${lines.join(", ")} of this file; keep one ${unit} per patient.` });
    }
  }
  problems.sort((a, b) => a.line - b.line);
  return {
    rows: good.filter((r) => !repeated.has(r.line)),
    problems,
    badLines: [...new Set(problems.map((p) => p.line))],
  };
}
