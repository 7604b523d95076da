import "server-only";
// Importing patients from a file: check (preview and dry run, nothing written) and import (one
// transaction: every row or none). A row's fate is decided by lib/patient-import; this module
// reads the file, reads the site's patients with the same MRNs, writes, audits.
import { createHash, randomUUID } from "node:crypto";
import { db } from "@/db/client";
import { recordAudit, recordAudits, type AuditInput } from "@/db/queries/audit-write";
import { insertPatients, patientsByMrn, updatePatients } from "@/db/queries/patient-import";
import type { SiteScope } from "@/db/queries/scope";
import { AppError } from "@/lib/errors";
import { planRow, type RowPlan, type StoredPatient } from "@/lib/patient-import/merge";
import { buildReport, type ImportReport, type ImportResult } from "@/lib/patient-import/report";
import { checkRows, type ImportRow, type RowProblem } from "@/lib/patient-import/rows";
import type { ImportCheckInput, ImportRunInput } from "@/lib/validation/patient-import";
import { readImportFile } from "./patient-import-file";

interface Checked {
  report: ImportReport;
  rows: ImportRow[];
}

const mrnsOf = (rows: ImportRow[]) => rows.map((r) => r.values.mrn);

function planAll(rows: ImportRow[], stored: StoredPatient[]): { plans: (RowPlan & { line: number })[]; conflicts: RowProblem[] } {
  const byMrn = new Map(stored.map((p) => [p.mrn, p]));
  const plans = rows.map((r) => ({ ...planRow(byMrn.get(r.values.mrn) ?? null, r.values), line: r.line }));
  const conflicts = plans.flatMap((p) => (p.kind === "conflict" ? [{ line: p.line, field: "mrn" as const, message: p.message }] : []));
  return { plans, conflicts };
}

/** The site imported into must be one of the caller's; another site's answers as if it did not exist. */
function siteOf(scope: SiteScope, input: ImportCheckInput): string {
  if (!scope.siteIds.includes(input.siteId)) throw new AppError("not_found");
  return input.siteId;
}

/** Reads and checks the whole file against the rules and the site's patients; writes nothing. */
async function check(siteId: string, input: ImportCheckInput): Promise<Checked> {
  const file = await readImportFile(input);
  const base = { format: input.format, headers: file.table.headers, mapping: file.mapping, records: file.table.records, notes: file.notes };
  if (file.mappingProblems.length) {
    return { rows: [], report: buildReport({ ...base, mappingProblems: file.mappingProblems, problems: file.problems, plan: { create: 0, update: 0, unchanged: 0 } }) };
  }
  const rowCheck = checkRows(file.table, file.mapping, input.format === "csv" ? "line" : "entry");
  const { plans, conflicts } = planAll(rowCheck.rows, await patientsByMrn(db, siteId, mrnsOf(rowCheck.rows), false));
  const count = (k: RowPlan["kind"]) => plans.filter((p) => p.kind === k).length;
  const bad = new Set(conflicts.map((c) => c.line));
  return {
    rows: rowCheck.rows.filter((r) => !bad.has(r.line)),
    report: buildReport({
      ...base,
      mappingProblems: [],
      problems: [...file.problems, ...rowCheck.problems, ...conflicts],
      plan: { create: count("create"), update: count("update"), unchanged: count("unchanged") },
    }),
  };
}

/** The preview and dry run: the column mapping, the first rows, every row's problems, what an import would do. */
export async function checkImport(scope: SiteScope, input: ImportCheckInput): Promise<ImportReport> {
  return (await check(siteOf(scope, input), input)).report;
}

export interface PendingImport {
  siteId: string;
  userId: string;
  ip: string;
  input: ImportRunInput;
  rows: ImportRow[];
  report: ImportReport;
}

/**
 * Checks the file again (the client's word is not taken for it). A file with bad rows is refused
 * as a whole unless the user chose to import the good ones; the refusal carries the report.
 */
export async function startImport(scope: SiteScope, input: ImportRunInput, ip: string): Promise<{ ok: true; job: PendingImport } | { ok: false; message: string; report: ImportReport }> {
  const siteId = siteOf(scope, input);
  const { report, rows } = await check(siteId, input);
  if (report.mappingProblems.length) return { ok: false, report, message: report.mappingProblems.join(" ") };
  if (report.badRows > 0 && !input.acceptValidRows) {
    return { ok: false, report, message: `${report.badRows} of ${report.total} ${report.unit === "line" ? "rows" : "entries"} have problems, so nothing was imported. Correct them, or choose to import only the valid rows.` };
  }
  if (rows.length === 0) return { ok: false, report, message: "No row of this file can be imported." };
  return { ok: true, job: { siteId, userId: scope.userId, ip, input, rows, report } };
}

const CHUNK = 1_000;

/**
 * Writes the import in one transaction, in chunks of rows so that progress can be told; the
 * patients with these MRNs are locked and planned again inside it, so what is written matches
 * the database as it is, not as it was at the check. Any failure writes nothing.
 */
export async function commitImport(job: PendingImport, onProgress: (done: number, total: number) => void): Promise<ImportResult> {
  const importId = randomUUID();
  const { siteId, userId, ip, rows } = job;
  try {
    return await db.transaction(async (tx) => {
      const { plans, conflicts } = planAll(rows, await patientsByMrn(tx, siteId, mrnsOf(rows), true));
      if (conflicts.length) throw new AppError("conflict", "Patients with these MRNs changed since the file was checked. Check the file again.");
      const creates = plans.flatMap((p) => (p.kind === "create" ? [{ ...p.values, id: randomUUID(), line: p.line }] : []));
      const updates = plans.flatMap((p) => (p.kind === "update" ? [{ ...p.values, id: p.patient.id, version: p.patient.version, line: p.line, changes: p.changes }] : []));
      const total = creates.length + updates.length;
      let done = 0;
      onProgress(done, total);
      for (let i = 0; i < creates.length; i += CHUNK) {
        const part = creates.slice(i, i + CHUNK);
        await insertPatients(tx, siteId, part);
        onProgress((done += part.length), total);
      }
      for (let i = 0; i < updates.length; i += CHUNK) {
        const part = updates.slice(i, i + CHUNK);
        if ((await updatePatients(tx, siteId, part)) !== part.length) throw new AppError("conflict", "A patient changed while the import ran. Check the file again.");
        onProgress((done += part.length), total);
      }
      const base = { userId, siteId, ip, entityType: "patient" };
      const events: AuditInput[] = [
        ...creates.map((c) => ({ ...base, patientId: c.id, entityId: c.id, action: "patient.create", detail: { importId, line: c.line } })),
        ...updates.map((u) => ({ ...base, patientId: u.id, entityId: u.id, action: "patient.update", detail: { importId, line: u.line, changes: u.changes, version: u.version + 1 } })),
      ];
      for (let i = 0; i < events.length; i += CHUNK * 5) await recordAudits(events.slice(i, i + CHUNK * 5), tx);
      const result: ImportResult = { importId, created: creates.length, updated: updates.length, unchanged: plans.length - total, skipped: job.report.badRows };
      const { format, fileName, content } = job.input;
      await recordAudit({ ...base, entityType: "patient_import", entityId: importId, action: "patient.import", detail: { format, fileName: fileName ?? null, sha256: createHash("sha256").update(content).digest("hex"), rows: job.report.total, ...result } }, tx);
      return result;
    });
  } catch (err) {
    // Another registration or import added one of these MRNs at the same time (unique per site).
    if ((err as { code?: string; cause?: { code?: string } }).code === "23505" || (err as { cause?: { code?: string } }).cause?.code === "23505") {
      throw new AppError("conflict", "A patient with one of these MRNs was added at the same time. Check the file again.");
    }
    throw err;
  }
}
