// The import page's two calls: the check (preview and dry run) and the import, whose answer is
// read line by line as it streams so the page can show progress.
import { ApiError, sendJson } from "@/components/data/fetcher";
import { api } from "@/components/data/keys";
import type { ColumnMapping } from "@/lib/patient-import/fields";
import type { ImportEvent, ImportReport, ImportResult } from "@/lib/api/types";
import type { ImportFormat } from "@/lib/patient-import/report";

export interface ImportRequest {
  siteId: string;
  format: ImportFormat;
  fileName: string;
  content: string;
  mapping?: ColumnMapping;
}

export function checkImportFile(r: ImportRequest): Promise<ImportReport> {
  return sendJson<ImportReport>("POST", api.patientImportCheck, r);
}

/** A refused import: the server's reason, and the report when the file's rows were the reason. */
export class ImportRefused extends ApiError {
  readonly report?: ImportReport;
  constructor(status: number, code: string, message: string, fields?: Record<string, string[]>, report?: ImportReport) {
    super(status, code, message, fields);
    this.report = report;
  }
}

export async function runImport(r: ImportRequest & { acceptValidRows: boolean }, onProgress: (done: number, total: number) => void): Promise<ImportResult> {
  let res: Response;
  try {
    res = await fetch(api.patientImport, { method: "POST", credentials: "same-origin", headers: { "content-type": "application/json" }, body: JSON.stringify(r) });
  } catch {
    throw new ApiError(0, "network", "The server could not be reached. Nothing was imported; check the connection and try again.");
  }
  if (!res.ok || !res.body) {
    const body = (await res.json().catch(() => null)) as { error?: { code?: string; message?: string; fields?: Record<string, string[]> }; report?: ImportReport } | null;
    throw new ImportRefused(res.status, body?.error?.code ?? `http_${res.status}`, body?.error?.message ?? `The server answered ${res.status}.`, body?.error?.fields, body?.report);
  }
  const reader = res.body.pipeThrough(new TextDecoderStream()).getReader();
  let buffer = "";
  for (;;) {
    const { value, done } = await reader.read();
    if (value) buffer += value;
    let nl: number;
    while ((nl = buffer.indexOf("\n")) >= 0) {
      const event = JSON.parse(buffer.slice(0, nl)) as ImportEvent;
      buffer = buffer.slice(nl + 1);
      if (event.stage === "writing") onProgress(event.done, event.total);
      else if (event.stage === "done") return event.result;
      else throw new ApiError(409, event.error.code, `${event.error.message} Nothing was imported.`);
    }
    if (done) throw new ApiError(0, "network", "The answer was cut off. Nothing was imported unless the patient list shows otherwise; check it before trying again.");
  }
}
