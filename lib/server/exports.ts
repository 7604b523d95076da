import "server-only";
import { PassThrough, Transform, type Readable } from "node:stream";
import { recordAudit } from "@/db/queries/audit-write";
import type { ExportDataset } from "@/lib/validation/research";
import { EXPORT_DATASETS } from "@/lib/validation/research";
import { exportCsvCopy, exportRowCursor } from "@/db/queries/research/export-sql";
import type { ExportScope } from "@/db/queries/research/export-scope";
import { dictionaryRows } from "@/lib/exports/data-dictionary";

export interface ExportAudit {
  userId: string;
  ip: string;
  format: "csv" | "xlsx";
  reason?: string;
}

/** One audit event per export, written when it has ended (complete or failed), with the rows sent. */
function auditExport(scope: ExportScope, datasets: readonly ExportDataset[], audit: ExportAudit, rows: Record<string, number>, outcome: "complete" | "failed") {
  // The reason is recorded on its own below, never inside the filter.
  const filter = { ...scope.filter, reason: undefined };
  void recordAudit({
    userId: audit.userId,
    ip: audit.ip,
    action: scope.filter.identified ? "export.identified" : "export.deidentified",
    entityType: "study",
    entityId: scope.filter.studyId,
    detail: { datasets, format: audit.format, filter, rows, outcome, ...(audit.reason ? { reason: audit.reason } : {}) },
  }).catch((err) => console.error("[dentate] export audit failed", err));
}

/**
 * Counts CSV records by their line ends as the bytes pass. Export fields are numbers, enums,
 * study IDs and (identified export) names, none of which can hold a line break, so every
 * newline ends one record.
 */
function lineCounter(onEnd: (records: number, failed: boolean) => void): Transform {
  let lines = 0;
  // COPY sends one message per row; forwarding ~100-byte chunks one by one costs a promise and a
  // socket write each on the way out, so rows are gathered into blocks of about 64 KB.
  let held: Buffer[] = [];
  let heldBytes = 0;
  return new Transform({
    transform(chunk: Buffer, _enc, done) {
      for (let i = chunk.indexOf(10); i !== -1; i = chunk.indexOf(10, i + 1)) lines++;
      held.push(chunk);
      heldBytes += chunk.length;
      if (heldBytes < BLOCK_BYTES) return done();
      const block = Buffer.concat(held, heldBytes);
      held = [];
      heldBytes = 0;
      done(null, block);
    },
    flush(done) {
      if (heldBytes) this.push(Buffer.concat(held, heldBytes));
      onEnd(Math.max(0, lines - 1), false);
      done();
    },
    destroy(err, done) {
      if (err) onEnd(Math.max(0, lines - 1), true);
      done(err);
    },
  });
}

const BLOCK_BYTES = 64 * 1024;

/**
 * One dataset as CSV straight out of PostgreSQL: COPY … TO STDOUT (FORMAT csv, HEADER) quotes
 * fields the RFC 4180 way and writes UTF-8; Node only forwards the bytes. Audited when the last
 * byte has gone (or the stream failed), with the number of records.
 */
export async function streamCsvExport(dataset: ExportDataset, scope: ExportScope, audit: ExportAudit): Promise<Readable> {
  const source = await exportCsvCopy(dataset, scope);
  let audited = false;
  const counter = lineCounter((records, failed) => {
    if (audited) return;
    audited = true;
    auditExport(scope, [dataset], audit, { [dataset]: records }, failed ? "failed" : "complete");
  });
  source.on("error", (err) => counter.destroy(err));
  return source.pipe(counter);
}

const SHEET_NAMES: Record<ExportDataset, string> = { counts: "Counts per visit", lesions: "Lesions", outcomes: "Outcomes" };

/**
 * The three datasets as one workbook, written row by row with exceljs's streaming writer while a
 * postgres.js cursor reads the same SELECTs the CSV export copies, so memory stays flat.
 */
export function streamWorkbookExport(scope: ExportScope, audit: ExportAudit): Readable {
  const out = new PassThrough();
  const rows: Record<string, number> = {};
  const run = async () => {
    // Loaded here, not at the top: the CSV exports share this module and need none of it.
    const { default: ExcelJS } = await import("exceljs");
    const wb = new ExcelJS.stream.xlsx.WorkbookWriter({ stream: out, useSharedStrings: false, useStyles: false });
    for (const dataset of EXPORT_DATASETS) {
      const sheet = wb.addWorksheet(SHEET_NAMES[dataset]);
      let n = 0;
      const cursor = exportRowCursor(dataset, scope);
      for await (const batch of cursor) {
        if (n === 0 && batch.length) {
          const header = Object.keys(batch[0]!);
          sheet.columns = header.map((key) => ({ header: key, key }));
        }
        for (const row of batch) sheet.addRow(normaliseRow(row)).commit();
        n += batch.length;
      }
      if (n === 0) sheet.addRow(["No rows match this filter."]).commit();
      sheet.commit();
      rows[dataset] = n;
    }
    // What every outcome column means, and which recurrence is which (lib/exports/data-dictionary).
    const dictionary = wb.addWorksheet("Data dictionary");
    dictionary.columns = [{ header: "dataset", key: "dataset" }, { header: "column", key: "column" }, { header: "meaning", key: "meaning" }];
    for (const row of dictionaryRows()) dictionary.addRow(row).commit();
    dictionary.commit();
    await wb.commit();
  };
  run().then(
    () => auditExport(scope, EXPORT_DATASETS, audit, rows, "complete"),
    (err) => {
      auditExport(scope, EXPORT_DATASETS, audit, rows, "failed");
      out.destroy(err instanceof Error ? err : new Error(String(err)));
    },
  );
  return out;
}

/** postgres.js gives bigint counts and numerics as strings; a statistician wants numbers in cells. */
function normaliseRow(row: Record<string, unknown>): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(row)) {
    if (typeof v === "string" && /^-?\d+(\.\d+)?$/.test(v) && k !== "study_id" && k !== "mrn") out[k] = Number(v);
    else if (v instanceof Date) out[k] = v.toISOString().slice(0, 10);
    else out[k] = v;
  }
  return out;
}
