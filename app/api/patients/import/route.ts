import { scopeOf } from "@/lib/auth/guard";
import { errorToBody } from "@/lib/errors";
import { json, readJson, route } from "@/lib/http/route";
import type { ImportEvent } from "@/lib/patient-import/report";
import { commitImport, startImport } from "@/lib/server/patient-import";
import { importRunSchema } from "@/lib/validation/patient-import";
import { IMPORT_BODY_LIMIT } from "@/lib/patient-import/limits";

/**
 * Imports the file. Every check is made before the answer starts: a refused file is an ordinary
 * 400 (with the report). An accepted one is answered with newline-delimited JSON: progress lines
 * while the one transaction writes, then the result, or a failure after which nothing is written.
 */
export const POST = route({ roles: ["clinician", "admin"] }, async ({ req, user, ip }) => {
  const body = await readJson(req, importRunSchema, IMPORT_BODY_LIMIT);
  const started = await startImport(scopeOf(user), body, ip);
  if (!started.ok) return json({ error: { code: "invalid", message: started.message }, report: started.report }, 400);
  const encoder = new TextEncoder();
  // A reader that went away (the page was closed) does not stop the import: it finishes or
  // fails as a whole either way, and its audit row tells what happened.
  let open = true;
  const stream = new ReadableStream<Uint8Array>({
    async start(controller) {
      const send = (e: ImportEvent) => {
        if (!open) return;
        try {
          controller.enqueue(encoder.encode(JSON.stringify(e) + "\n"));
        } catch {
          open = false;
        }
      };
      try {
        const result = await commitImport(started.job, (done, total) => send({ stage: "writing", done, total }));
        send({ stage: "done", result });
      } catch (err) {
        const { body: b } = errorToBody(err);
        send({ stage: "failed", error: { code: b.error.code, message: b.error.message } });
      }
      if (open) controller.close();
    },
    cancel() {
      open = false;
    },
  });
  return new Response(stream, { status: 200, headers: { "content-type": "application/x-ndjson", "cache-control": "no-store" } });
});
