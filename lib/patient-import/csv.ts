// Reading a CSV file into a header row and numbered records. Pure (csv-parse does no I/O here).
import { parse } from "csv-parse/sync";
import { MAX_COLUMNS, MAX_ROWS } from "./limits";

export interface SourceRecord {
  /** Where the record starts in the file, counting the header as line 1 (or the bundle entry number). */
  line: number;
  cells: string[];
}

export interface SourceTable {
  headers: string[];
  records: SourceRecord[];
}

export type FileRead = { ok: true; table: SourceTable } | { ok: false; message: string };

/** The separator the header line uses most: comma, semicolon (spreadsheets in many locales) or tab. */
function delimiterOf(text: string): string {
  const first = text.slice(0, text.search(/\r?\n|$/));
  const counts = [",", ";", "\t"].map((d) => [d, first.split(d).length] as const);
  return counts.reduce((a, b) => (b[1] > a[1] ? b : a))[0];
}

const newlines = (s: string) => (s.match(/\n/g) ?? []).length;

export function readCsv(original: string): FileRead {
  // One kind of line break: csv-parse counts a CR LF inside a quoted cell as two lines, which
  // would put every later line number off by one.
  const text = original.replace(/\r\n?/g, "\n");
  if (text.includes("\u0000")) return { ok: false, message: "This is not a text file (it holds NUL bytes). Save it from the spreadsheet as CSV." };
  let rows: { record: string[]; info: { lines: number } }[];
  try {
    rows = parse(text, {
      bom: true,
      delimiter: delimiterOf(text.replace(/^\uFEFF/, "")),
      info: true,
      relax_column_count: true,
      skip_empty_lines: true,
      // One more than the limit, to tell "too many" from "exactly the limit" without reading on.
      to: MAX_ROWS + 2,
    }) as unknown as typeof rows;
  } catch (e) {
    const err = e as { message?: string; lines?: number };
    return { ok: false, message: `The file cannot be read as CSV near line ${err.lines ?? "?"}: ${String(err.message ?? e).replace(/^[^:]*: /, "").slice(0, 200)}` };
  }
  if (rows.length === 0) return { ok: false, message: "The file is empty." };
  const headers = rows[0]!.record.map((h) => h.trim());
  if (headers.length > MAX_COLUMNS) return { ok: false, message: `The file has ${headers.length} columns; at most ${MAX_COLUMNS} are read.` };
  const records = rows.slice(1).map(({ record, info }) => ({
    // csv-parse counts the line a record ends on; a quoted cell may span several lines.
    line: info.lines - record.reduce((n, c) => n + newlines(c), 0),
    cells: record,
  }));
  if (records.length === 0) return { ok: false, message: "The file has a header line but no patients under it." };
  if (records.length > MAX_ROWS) return { ok: false, message: `The file has more than ${MAX_ROWS.toLocaleString("en")} patient rows. Split it into files of at most ${MAX_ROWS.toLocaleString("en")} rows.` };
  return { ok: true, table: { headers, records } };
}
