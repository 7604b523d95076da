import { Readable } from "node:stream";
import { streamCsvExport } from "@/lib/server/exports";
import { AppError } from "@/lib/errors";
import { route } from "@/lib/http/route";
import { datasetParam } from "@/lib/validation/research";
import { EXPORT_ROLES, attachmentHeaders, exportStamp, prepareExport } from "../prepare";

export const dynamic = "force-dynamic";

/** GET /api/exports/{counts|lesions|outcomes}?studyId=…: one dataset as streamed CSV. */
export const GET = route<{ dataset: string }>({ roles: EXPORT_ROLES }, async ({ req, user, params, ip }) => {
  const dataset = datasetParam.safeParse(params.dataset);
  if (!dataset.success) throw new AppError("not_found");
  const { scope, studyCode } = await prepareExport(req, user);
  const stream = await streamCsvExport(dataset.data, scope, { userId: user.id, ip, format: "csv", reason: scope.filter.reason });
  return new Response(Readable.toWeb(stream) as ReadableStream, {
    headers: attachmentHeaders(`${studyCode}-${dataset.data}-${exportStamp(scope.filter.identified)}.csv`, "text/csv; charset=utf-8"),
  });
});
