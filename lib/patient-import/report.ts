// What a check of an import file answers, and what an import streams back. Pure: shared by
// the service, the routes and the import page.
import { IMPORT_FIELDS, type ColumnMapping } from "./fields";
import { MAX_REPORTED_PROBLEMS, PREVIEW_ROWS } from "./limits";
import type { SourceRecord } from "./csv";
import type { RowProblem } from "./rows";

export type ImportFormat = "csv" | "fhir";

export interface ImportReport {
  format: ImportFormat;
  /** What a problem's number counts: file lines (CSV, header = 1) or bundle entries. */
  unit: "line" | "entry";
  headers: string[];
  mapping: ColumnMapping;
  fields: { key: string; label: string; required: boolean }[];
  preview: SourceRecord[];
  /** Records in the file (patients, good or bad). */
  total: number;
  /** Problems of the mapping as a whole; while there are any, no row is read. */
  mappingProblems: string[];
  problems: RowProblem[];
  /** Problems not listed because the list is long. */
  problemsLeftOut: number;
  badRows: number;
  /** What importing the good rows would do. */
  plan: { create: number; update: number; unchanged: number };
  notes: string[];
}

export function buildReport(args: {
  format: ImportFormat;
  headers: string[];
  mapping: ColumnMapping;
  records: SourceRecord[];
  mappingProblems: string[];
  problems: RowProblem[];
  plan: ImportReport["plan"];
  notes?: string[];
}): ImportReport {
  const problems = [...args.problems].sort((a, b) => a.line - b.line);
  return {
    format: args.format,
    unit: args.format === "csv" ? "line" : "entry",
    headers: args.headers,
    mapping: args.mapping,
    fields: IMPORT_FIELDS.map((f) => ({ key: f.key, label: f.label, required: f.required })),
    preview: args.records.slice(0, PREVIEW_ROWS),
    total: args.records.length,
    mappingProblems: args.mappingProblems,
    problems: problems.slice(0, MAX_REPORTED_PROBLEMS),
    problemsLeftOut: Math.max(0, problems.length - MAX_REPORTED_PROBLEMS),
    badRows: new Set(problems.map((p) => p.line)).size,
    plan: args.plan,
    notes: args.notes ?? [],
  };
}

/** One line of the import's streamed answer (newline-delimited JSON). */
export type ImportEvent =
  | { stage: "writing"; done: number; total: number }
  | { stage: "done"; result: ImportResult }
  | { stage: "failed"; error: { code: string; message: string } };

export interface ImportResult {
  importId: string;
  created: number;
  updated: number;
  unchanged: number;
  /** Rows with problems left out on the user's explicit choice. */
  skipped: number;
}
