import { Readable } from "node:stream";
import { streamCsvExport } from "@/lib/server/exports";
import { AppError } from "@/lib/errors";
import { route, type RouteArgs } from "@/lib/http/route";
import { datasetParam } from "@/lib/validation/research";
import { EXPORT_ROLES, attachmentHeaders, exportStamp, prepareExport } from "../prepare";

export const dynamic = "force-dynamic";

/** GET /api/exports/{counts|lesions|outcomes}?studyId=…: one dataset as streamed CSV. */
const exportCsv = async ({ req, user, params, ip }: RouteArgs<{ dataset: string }>) => {
  const dataset = datasetParam.safeParse(params.dataset);
  if (!dataset.success) throw new AppError("not_found");
  const { scope, studyCode } = await prepareExport(req, user);
  const stream = await streamCsvExport(dataset.data, scope, { userId: user.id, ip, format: "csv", reason: scope.filter.reason });
  return new Response(Readable.toWeb(stream) as ReadableStream, {
    headers: attachmentHeaders(`${studyCode}-${dataset.data}-${exportStamp(scope.filter.identified)}.csv`, "text/csv; charset=utf-8"),
  });
};

/** De-identified exports are links (GET); an identified one is refused there (403). */
export const GET = route<{ dataset: string }>({ roles: EXPORT_ROLES }, exportCsv);
/** The export form's POST (Origin checked): the only way to an identified export, admins only. */
export const POST = route<{ dataset: string }>({ roles: ["admin"] }, exportCsv);
